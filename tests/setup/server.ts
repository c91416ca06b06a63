import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { existsSync, mkdtempSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import type { TestProject } from 'vitest/node'

// Global setup for the api and e2e tiers: one real built server per tier, on a free port, with its
// own temporary SQLite file and uploads folder, migrated and seeded with the demo workshops.
// `npm test` builds before Vitest runs; a lone `vitest --project api` builds here if needed.

declare module 'vitest' {
  export interface ProvidedContext {
    baseUrl: string
    dataDir: string
  }
}

const root = resolve(import.meta.dirname, '..', '..')

function freePort(): Promise<number> {
  return new Promise((done, fail) => {
    const probe = createServer()
    probe.once('error', fail)
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address()
      probe.close(() => typeof address === 'object' && address ? done(address.port) : fail(new Error('no port')))
    })
  })
}

async function waitUntilUp(url: string, child: ChildProcess, log: () => string) {
  const deadline = Date.now() + 60_000
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`The test server exited with code ${child.exitCode}:\n${log()}`)
    try {
      const response = await fetch(`${url}/api/health`)
      if (response.ok) return
    }
    catch {
      // not listening yet
    }
    await new Promise(r => setTimeout(r, 200))
  }
  throw new Error(`The test server did not answer within 60 s:\n${log()}`)
}

export interface RunningServer {
  baseUrl: string
  dataDir: string
  // The server process, for scripts that measure it (memory).
  pid: number
  stop: () => Promise<void>
}

export function ensureBuilt() {
  const entry = join(root, '.output', 'server', 'index.mjs')
  if (!existsSync(entry)) {
    const build = spawnSync(process.execPath, [join(root, 'node_modules', 'nuxt', 'bin', 'nuxt.mjs'), 'build'], { cwd: root, stdio: 'inherit' })
    if (build.status !== 0) throw new Error('nuxt build failed')
  }
  return entry
}

// Start the built server on a free port with its own temporary database and uploads folder.
export async function startServer(name: string, env: Record<string, string> = {}): Promise<RunningServer> {
  const entry = ensureBuilt()
  const dataDir = mkdtempSync(join(tmpdir(), `densitas-${name}-`))
  const port = await freePort()
  const baseUrl = `http://127.0.0.1:${port}`
  let output = ''
  const child = spawn(process.execPath, [entry], {
    cwd: root,
    env: {
      ...process.env,
      NODE_ENV: 'production',
      HOST: '127.0.0.1',
      PORT: String(port),
      DATABASE_URL: join(dataDir, 'densitas.sqlite'),
      UPLOADS_DIR: join(dataDir, 'uploads'),
      NUXT_SESSION_PASSWORD: 'test-only-session-password-0123456789abcdef',
      NUXT_SEED_DEMO: 'true',
      // Tests pose as different clients through X-Forwarded-For to exercise the per-address limit.
      NUXT_TRUST_PROXY: 'true',
      NUXT_PUBLIC_APP_URL: baseUrl,
      ...env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  child.stdout!.on('data', (chunk) => {
    output += chunk
  })
  child.stderr!.on('data', (chunk) => {
    output += chunk
  })
  await waitUntilUp(baseUrl, child, () => output)
  return {
    baseUrl,
    dataDir,
    pid: child.pid!,
    stop: async () => {
      child.kill('SIGTERM')
      await new Promise(r => child.exitCode !== null ? r(null) : child.once('exit', r))
      rmSync(dataDir, { recursive: true, force: true })
    },
  }
}

export default async function setup(project: TestProject) {
  const server = await startServer(project.name)
  project.provide('baseUrl', server.baseUrl)
  project.provide('dataDir', server.dataDir)
  return server.stop
}
