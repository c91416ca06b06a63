// `npm start`: build when the sources are newer than the last build, make sure a session secret
// exists, then serve the built app. The database is migrated and seeded by the server at start-up.
import { spawn, spawnSync } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, readdirSync, statSync, writeFileSync } from 'node:fs'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..')
process.chdir(root)

// The built server does not read .env by itself; do it here without overriding the real environment.
function loadDotEnv(file) {
  if (!existsSync(file)) return
  for (const line of readFileSync(file, 'utf8').split(/\r?\n/)) {
    const match = /^\s*([A-Z0-9_]+)\s*=\s*(.*)\s*$/.exec(line)
    if (!match || process.env[match[1]] !== undefined) continue
    process.env[match[1]] = match[2].replace(/^(['"])(.*)\1$/, '$2')
  }
}
loadDotEnv(join(root, '.env'))

function ensureSessionPassword() {
  if ((process.env.NUXT_SESSION_PASSWORD ?? '').length >= 32) return
  if (process.env.NUXT_SESSION_PASSWORD) {
    console.error('NUXT_SESSION_PASSWORD is shorter than 32 characters. Use a longer random value, or unset it to let Densitas make one.')
    process.exit(1)
  }
  const file = join(root, 'data', '.session-password')
  if (!existsSync(file)) {
    mkdirSync(dirname(file), { recursive: true })
    writeFileSync(file, randomBytes(32).toString('hex'), { mode: 0o600 })
    console.log(`No NUXT_SESSION_PASSWORD set: generated one and kept it in ${file} (git-ignored).`)
  }
  process.env.NUXT_SESSION_PASSWORD = readFileSync(file, 'utf8').trim()
}
ensureSessionPassword()

const SOURCES = ['app.vue', 'error.vue', 'nuxt.config.ts', 'tailwind.config.ts', 'package-lock.json', 'assets', 'components', 'composables', 'db', 'layouts', 'middleware', 'pages', 'plugins', 'public', 'server', 'shared', 'stores']

function newestMtime(path) {
  if (!existsSync(path)) return 0
  const stat = statSync(path)
  if (!stat.isDirectory()) return stat.mtimeMs
  return readdirSync(path).reduce((max, name) => Math.max(max, newestMtime(join(path, name))), stat.mtimeMs)
}

const entry = join(root, '.output', 'server', 'index.mjs')
const builtAt = existsSync(entry) ? statSync(entry).mtimeMs : 0
if (process.argv.includes('--rebuild') || SOURCES.some(path => newestMtime(join(root, path)) > builtAt)) {
  console.log('Building Densitas (about a minute on first start)…')
  const build = spawnSync(process.execPath, [join(root, 'node_modules', 'nuxt', 'bin', 'nuxt.mjs'), 'build'], { stdio: 'inherit' })
  if (build.status !== 0) process.exit(build.status ?? 1)
}

const port = process.env.PORT || '3000'
process.env.NUXT_PUBLIC_APP_URL ||= process.env.APP_URL || `http://localhost:${port}`
const server = spawn(process.execPath, [entry], { stdio: 'inherit', env: { ...process.env, PORT: port } })
if (process.env.NUXT_SEED_DEMO !== 'false') {
  console.log(`
Densitas on http://localhost:${port}
Demo sign-ins (password: densitas-demo):
  owner@kestrel.test  tuner@kestrel.test  fab@kestrel.test  driver@kestrel.test  driver2@kestrel.test
  owner@harbourside.test  driver@harbourside.test
`)
}
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.kill(signal))
server.on('exit', code => process.exit(code ?? 0))
