import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startServer, type RunningServer } from '../setup/server'

// A production start: NUXT_SEED_DEMO=false migrates the database but seeds nothing.
describe('a production start', () => {
  let server: RunningServer
  beforeAll(async () => {
    server = await startServer('production', { NUXT_SEED_DEMO: 'false' })
  })
  afterAll(async () => {
    await server.stop()
  })

  it('creates every table but no demo workshop or account', async () => {
    expect((await fetch(`${server.baseUrl}/api/health`)).status).toBe(200)
    const db = new Database(`${server.dataDir}/densitas.sqlite`, { readonly: true })
    try {
      const tables = (db.prepare('select name from sqlite_master where type = \'table\'').all() as Array<{ name: string }>).map(t => t.name)
      expect(tables).toEqual(expect.arrayContaining(['workshops', 'users', 'vehicles', 'logs', 'analyses', 'quotes', 'outbox', 'audit_events']))
      expect((db.prepare('select count(*) n from workshops').get() as { n: number }).n).toBe(0)
      expect((db.prepare('select count(*) n from users').get() as { n: number }).n).toBe(0)
      expect(db.pragma('journal_mode', { simple: true })).toBe('wal')
    }
    finally {
      db.close()
    }
    const login = await fetch(`${server.baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'owner@kestrel.test', password: 'densitas-demo' }) })
    expect(login.status).toBe(401)
  })
})
