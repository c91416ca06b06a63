import { spawnSync } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startServer, type RunningServer } from '../setup/server'

// The first start of a production install (NUXT_SEED_DEMO=false): an empty database, and two ways
// to create the first workshop and its owner — the setup page and `npm run setup`.

const root = resolve(import.meta.dirname, '..', '..')
const PASSWORD = 'first owner passphrase'

interface Reply<T = Record<string, unknown>> { status: number, body: T, cookie: string }

async function call<T = Record<string, unknown>>(base: string, method: string, path: string, body?: unknown, cookie = ''): Promise<Reply<T>> {
  const headers: Record<string, string> = {}
  if (cookie) headers.cookie = cookie
  if (body !== undefined) headers['content-type'] = 'application/json'
  const response = await fetch(`${base}${path}`, { method, headers, body: body === undefined ? undefined : JSON.stringify(body), redirect: 'manual' })
  const text = await response.text()
  let parsed: unknown = text
  try {
    parsed = JSON.parse(text)
  }
  catch {
    // a page: keep the HTML
  }
  return { status: response.status, body: parsed as T, cookie: response.headers.get('set-cookie')?.split(';')[0] ?? '' }
}

function count(dataDir: string, table: string) {
  const db = new Database(join(dataDir, 'densitas.sqlite'), { readonly: true })
  try {
    return (db.prepare(`select count(*) n from ${table}`).get() as { n: number }).n
  }
  finally {
    db.close()
  }
}

const workshop = (n: number) => ({ workshopName: `Fenmoor Turbo Works ${n}`, currency: 'GBP', ownerName: `Rhea Lind ${n}`, email: `rhea${n}@fenmoor.test`, password: PASSWORD })

describe('the setup page on a production start', () => {
  let server: RunningServer
  beforeAll(async () => {
    server = await startServer('setup', { NUXT_SEED_DEMO: 'false' })
  })
  afterAll(async () => {
    await server.stop()
  })

  it('is open while no workshop exists, and the sign-in page links to it', async () => {
    expect(await call(server.baseUrl, 'GET', '/api/setup')).toMatchObject({ status: 200, body: { open: true } })
    const page = await call<string>(server.baseUrl, 'GET', '/setup')
    expect(page.status).toBe(200)
    expect(page.body).toContain('Set up your workshop')
    const login = await call<string>(server.baseUrl, 'GET', '/login')
    expect(login.body).toMatch(/No workshop has been set up here yet\.\s*<a href="\/setup"/)
  })

  it.each([
    ['a short password', { password: 'short' }, 'use at least 10 characters'],
    ['a bad e-mail address', { email: 'rhea at fenmoor' }, 'enter an e-mail address like name@example.com'],
    ['an unknown currency', { currency: 'XYZ' }, 'choose the currency the workshop prices in (EUR, GBP, USD, CHF, SEK, NOK, DKK, PLN, CZK, AUD, NZD, CAD)'],
    ['no workshop name', { workshopName: ' ' }, 'give the workshop a name of at least 2 characters'],
    ['no owner name', { ownerName: '' }, 'enter your name'],
  ])('refuses %s with 400 and a message saying what to fix, storing nothing', async (_what, change, words) => {
    const reply = await call<{ message: string }>(server.baseUrl, 'POST', '/api/setup', { ...workshop(0), ...change })
    expect(reply.status).toBe(400)
    expect(reply.body.message).toBe(`Check the form: ${words}.`)
    expect(count(server.dataDir, 'workshops')).toBe(0)
    expect(count(server.dataDir, 'users')).toBe(0)
  })

  it('lets exactly one of two setups sent at once create the workshop, and signs its owner in', async () => {
    const replies = await Promise.all([1, 2].map(n => call<{ user: { email: string, role: string }, message: string }>(server.baseUrl, 'POST', '/api/setup', workshop(n))))
    expect(replies.map(r => r.status).sort()).toEqual([201, 409])
    const winner = replies.find(r => r.status === 201)!
    const loser = replies.find(r => r.status === 409)!
    expect(loser.body.message).toBe('This Densitas already has a workshop, so setup is closed. Sign in, or ask the workshop owner for an invitation.')
    expect(count(server.dataDir, 'workshops')).toBe(1)
    expect(count(server.dataDir, 'users')).toBe(1)

    // Signed in by the setup itself: the cookie reaches the owner's own account.
    const n = winner.body.user.email === 'rhea1@fenmoor.test' ? 1 : 2
    const me = await call<{ user: { role: string, name: string }, workshop: { name: string, currency: string } }>(server.baseUrl, 'GET', '/api/me', undefined, winner.cookie)
    expect(me.status).toBe(200)
    expect(me.body).toMatchObject({ user: { role: 'owner', name: `Rhea Lind ${n}` }, workshop: { name: `Fenmoor Turbo Works ${n}`, currency: 'GBP' } })
    const signIn = await call(server.baseUrl, 'POST', '/api/auth/login', { email: `rhea${n}@fenmoor.test`, password: PASSWORD })
    expect(signIn.status).toBe(200)
  })

  it('is closed for good once a workshop exists: 404 for the page and the check, 409 for another setup', async () => {
    expect((await call(server.baseUrl, 'GET', '/api/setup')).status).toBe(404)
    expect((await call(server.baseUrl, 'GET', '/setup')).status).toBe(404)
    const again = await call<{ message: string }>(server.baseUrl, 'POST', '/api/setup', workshop(3))
    expect(again.status).toBe(409)
    expect(again.body.message).toContain('setup is closed')
    expect(count(server.dataDir, 'workshops')).toBe(1)
    const login = await call<string>(server.baseUrl, 'GET', '/login')
    expect(login.status).toBe(200)
    expect(login.body).not.toContain('/setup')
  })
})

describe('npm run setup on a fresh database', () => {
  const dir = mkdtempSync(join(tmpdir(), 'densitas-setup-command-'))
  const databaseUrl = join(dir, 'densitas.sqlite')
  const runSetup = (args: string[], options: { input?: string, env?: Record<string, string> } = {}) =>
    spawnSync(process.execPath, ['--import', 'tsx', 'scripts/setup.ts', ...args], {
      cwd: root,
      encoding: 'utf8',
      input: options.input ?? '',
      env: { ...process.env, DATABASE_URL: databaseUrl, DENSITAS_OWNER_PASSWORD: '', ...options.env },
    })
  const args = ['--workshop', 'Saltmarsh Boost Garage', '--email', 'Ines@Saltmarsh.test', '--name', 'Ines Varga', '--currency', 'SEK']
  let server: RunningServer | undefined

  afterAll(async () => {
    await server?.stop()
    rmSync(dir, { recursive: true, force: true })
  })

  it('says what is wrong with bad input, and creates nothing', () => {
    const out = runSetup(['--workshop', 'Saltmarsh Boost Garage', '--email', 'not-an-address', '--name', 'Ines Varga'], { input: 'short\n' })
    expect(out.status).toBe(1)
    expect(out.stderr).toContain('--email: enter an e-mail address like name@example.com')
    expect(out.stderr).toContain('the password: use at least 10 characters')
    expect(runSetup(['--colour', 'red'], { input: `${PASSWORD}\n` }).stderr).toContain('Unknown option --colour')
  }, 30_000)

  it('creates the workshop and its owner with the password from stdin; the server then signs the owner in', async () => {
    const out = runSetup(args, { input: `${PASSWORD}\n` })
    expect(out.stderr).toBe('')
    expect(out.status).toBe(0)
    expect(out.stdout).toContain('Created the workshop "Saltmarsh Boost Garage" (SEK) and its owner Ines Varga <ines@saltmarsh.test>')

    server = await startServer('setup-command', { NUXT_SEED_DEMO: 'false', DATABASE_URL: databaseUrl })
    const signIn = await call<{ user: { role: string } }>(server.baseUrl, 'POST', '/api/auth/login', { email: 'ines@saltmarsh.test', password: PASSWORD })
    expect(signIn.status).toBe(200)
    expect(signIn.body.user.role).toBe('owner')
    const me = await call<{ workshop: { name: string, currency: string } }>(server.baseUrl, 'GET', '/api/me', undefined, signIn.cookie)
    expect(me.body.workshop).toMatchObject({ name: 'Saltmarsh Boost Garage', currency: 'SEK' })
    // The page is closed: the command created the workshop.
    expect((await call(server.baseUrl, 'GET', '/api/setup')).status).toBe(404)
  }, 120_000)

  it('refuses a second setup, with the password from the environment too', () => {
    const out = runSetup(['--workshop', 'Another Garage', '--email', 'x@another.test', '--name', 'X'], { env: { DENSITAS_OWNER_PASSWORD: PASSWORD } })
    expect(out.status).toBe(1)
    expect(out.stderr).toContain('This database already has a workshop, so setup is closed.')
    const db = new Database(databaseUrl, { readonly: true })
    try {
      expect(db.prepare('select name from workshops').all()).toEqual([{ name: 'Saltmarsh Boost Garage' }])
    }
    finally {
      db.close()
    }
  }, 30_000)
})
