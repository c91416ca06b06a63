// Command line: create the first workshop and its owner on a database started without the demo,
// for installs without a browser at hand. The password comes from DENSITAS_OWNER_PASSWORD or stdin,
// never from an argument (arguments end up in shell history and process lists).
//   npm run setup -- --workshop "NAME" --email OWNER@EXAMPLE.COM --name "OWNER NAME" [--currency EUR]
// Exit code 0 when created, 1 with a message on bad input or when a workshop already exists.
import { existsSync, mkdirSync, readFileSync } from 'node:fs'
import { dirname, isAbsolute, resolve } from 'node:path'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import Database from 'better-sqlite3'
import { drizzle } from 'drizzle-orm/better-sqlite3'
import { migrate } from 'drizzle-orm/better-sqlite3/migrator'
import * as schema from '../db/schema'
import { createFirstWorkshop, firstRunFields, SetupClosedError } from '../server/utils/first-run'

const USAGE = 'Usage: DENSITAS_OWNER_PASSWORD=… npm run setup -- --workshop "NAME" --email OWNER@EXAMPLE.COM --name "OWNER NAME" [--currency EUR]\n(or pipe the password on stdin)'
const FLAGS: Record<string, 'workshopName' | 'email' | 'ownerName' | 'currency'> = {
  '--workshop': 'workshopName',
  '--email': 'email',
  '--name': 'ownerName',
  '--currency': 'currency',
}

function parseArgs(argv: string[]) {
  const values: Record<string, string> = { currency: 'EUR' }
  for (let i = 0; i < argv.length; i++) {
    const flag = argv[i]!
    if (flag === '--help' || flag === '-h') {
      console.log(USAGE)
      process.exit(0)
    }
    const key = FLAGS[flag]
    if (!key) throw new Error(`Unknown option ${flag}.\n${USAGE}`)
    const value = argv[++i]
    if (value === undefined) throw new Error(`${flag} needs a value.\n${USAGE}`)
    values[key] = value
  }
  return values
}

function readPassword() {
  const fromEnv = process.env.DENSITAS_OWNER_PASSWORD
  if (fromEnv) return fromEnv
  if (process.stdin.isTTY) throw new Error(`Give the owner's password in DENSITAS_OWNER_PASSWORD or on stdin.\n${USAGE}`)
  // One line from stdin, without its line ending.
  return readFileSync(0, 'utf8').replace(/\r?\n$/, '')
}

function databasePath() {
  const value = (process.env.DATABASE_URL || process.env.NUXT_DATABASE_URL || './data/densitas.sqlite').replace(/^file:/, '')
  return isAbsolute(value) ? value : resolve(process.cwd(), value)
}

async function main() {
  // The same .env that `npm start` reads; real environment variables win.
  if (existsSync('.env')) process.loadEnvFile('.env')
  const parsed = firstRunFields.safeParse({ ...parseArgs(process.argv.slice(2)), password: readPassword() })
  if (!parsed.success) {
    const flagOf: Record<string, string> = { workshopName: '--workshop', email: '--email', ownerName: '--name', currency: '--currency', password: 'the password' }
    throw new Error(parsed.error.issues.map(issue => `${flagOf[String(issue.path[0])] ?? 'input'}: ${issue.message}`).join('\n'))
  }
  const { password, ...input } = parsed.data

  const path = databasePath()
  mkdirSync(dirname(path), { recursive: true })
  const sqlite = new Database(path)
  try {
    sqlite.pragma('journal_mode = WAL')
    sqlite.pragma('foreign_keys = ON')
    sqlite.pragma('busy_timeout = 5000')
    const db = drizzle(sqlite, { schema })
    // The server migrates at start-up too; doing it here lets setup run before the first start.
    migrate(db, { migrationsFolder: resolve(process.cwd(), 'db/migrations') })
    // Scrypt with nuxt-auth-utils' default options, so the server verifies this hash at sign-in.
    const passwordHash = await new Hash(new Scrypt({})).make(password)
    const { workshop, owner } = createFirstWorkshop(db, input, passwordHash)
    console.log(`Created the workshop "${workshop.name}" (${workshop.currency}) and its owner ${owner.name} <${owner.email}> in ${path}.`)
    console.log('Start Densitas with NUXT_SEED_DEMO=false and sign in with that e-mail and password.')
  }
  finally {
    sqlite.close()
  }
}

main().catch((error: unknown) => {
  const message = error instanceof SetupClosedError
    ? 'This database already has a workshop, so setup is closed. Sign in with its owner, who invites everyone else.'
    : error instanceof Error ? error.message : String(error)
  console.error(`setup: ${message}`)
  process.exitCode = 1
})
