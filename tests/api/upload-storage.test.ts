import { existsSync, mkdtempSync, readFileSync, readdirSync, renameSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { generateDemoLog } from '../../server/analysis'
import { startServer, type RunningServer } from '../setup/server'

// Uploaded files go through Nitro's storage layer (server/utils/uploads.ts): a server started with
// another unstorage driver keeps them there and reads them back from there. The driver here is
// fs-lite with its own folder: it is not the fs driver, so every write, read and removal goes
// through the storage calls (setItemRaw, getItemRaw, removeItem), yet the test can look at where
// the files landed. The ordinary uploads folder must stay empty of logs.

const demo = generateDemoLog('stock-core-hot-day')

describe('uploads kept by another storage driver', () => {
  let server: RunningServer
  let cookie = ''
  let vehicleId = 0
  const storeDir = mkdtempSync(join(tmpdir(), 'densitas-elsewhere-'))
  const stored = (id: number) => join(storeDir, 'logs', String(id))

  function query<T>(sql: string, ...params: unknown[]): T {
    const db = new Database(`${server.dataDir}/densitas.sqlite`)
    try {
      return (sql.trim().startsWith('select') ? db.prepare(sql).get(...params) : db.prepare(sql).run(...params)) as T
    }
    finally {
      db.close()
    }
  }

  async function call(method: string, path: string, body?: BodyInit, headers: Record<string, string> = {}) {
    return fetch(`${server.baseUrl}${path}`, { method, headers: { cookie, origin: server.baseUrl, ...headers }, body })
  }

  async function upload(content: string | Uint8Array, fields: Record<string, string> = {}) {
    const form = new FormData()
    form.append('vehicleId', String(vehicleId))
    for (const [key, value] of Object.entries(fields)) form.append(key, value)
    form.append('file', new Blob([typeof content === 'string' ? content : new Uint8Array(content)]), 'hot-day.csv')
    return call('POST', '/api/logs', form)
  }

  beforeAll(async () => {
    server = await startServer('storage', { NUXT_UPLOADS_DRIVER: 'fs-lite', NUXT_UPLOADS_OPTIONS: JSON.stringify({ base: storeDir }) })
    for (let attempt = 0; attempt < 100 && !cookie; attempt++) {
      const login = await fetch(`${server.baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'origin': server.baseUrl }, body: JSON.stringify({ email: 'tuner@kestrel.test', password: 'densitas-demo' }) })
      cookie = login.ok ? login.headers.get('set-cookie')!.split(';')[0]! : ''
      if (!cookie) await new Promise(r => setTimeout(r, 200))
    }
    vehicleId = query<{ id: number }>('select v.id from vehicles v join users u on u.id = v.owner_id where u.email = ?', 'driver@kestrel.test').id
  }, 120_000)
  afterAll(async () => {
    await server?.stop()
    rmSync(storeDir, { recursive: true, force: true })
  })

  it('stores an upload there, gives it back for download and analyses it again from there', async () => {
    const reply = await upload(demo.csv)
    expect(reply.status).toBe(201)
    const { id } = await reply.json() as { id: number }
    expect(readFileSync(stored(id), 'utf8')).toBe(demo.csv)
    const ordinary = join(server.dataDir, 'uploads', 'logs')
    expect(existsSync(ordinary) ? readdirSync(ordinary) : []).toEqual([])

    const download = await call('GET', `/api/logs/${id}/download`)
    expect(download.status).toBe(200)
    expect(await download.text()).toBe(demo.csv)

    const series = await call('GET', `/api/logs/${id}/series?channels=chargeTemp&points=200`)
    expect(series.status).toBe(200)

    // An analysis from an older engine is made again from the stored bytes.
    const fresh = await (await call('GET', `/api/logs/${id}/analysis`)).json() as { summary: { pullCount: number } }
    query('update analyses set engine_version = ?, result = ? where log_id = ?', '0-old', JSON.stringify({ summary: { pullCount: 99 }, pulls: [] }), id)
    const again = await call('GET', `/api/logs/${id}/analysis`)
    expect(again.status).toBe(200)
    expect(((await again.json()) as { summary: { pullCount: number } }).summary.pullCount).toBe(fresh.summary.pullCount)
    expect(fresh.summary.pullCount).toBe(6)

    expect((await call('DELETE', `/api/logs/${id}`)).status).toBe(204)
    expect(existsSync(stored(id))).toBe(false)
    expect((await call('GET', `/api/logs/${id}/download`)).status).toBe(404)
  })

  it('answers 409 when a stale log\'s file is missing from the storage', async () => {
    const reply = await upload(demo.csv)
    const { id } = await reply.json() as { id: number }
    rmSync(stored(id))
    query('update analyses set engine_version = ? where log_id = ?', '0-old', id)
    const again = await call('GET', `/api/logs/${id}/analysis`)
    expect(again.status).toBe(409)
    expect((await call('GET', `/api/logs/${id}/download`)).status).toBe(404)
  })

  it('leaves neither row nor file behind when the log is refused', async () => {
    const files = () => readdirSync(join(storeDir, 'logs')).sort()
    const before = { logs: query<{ n: number }>('select count(*) n from logs').n, files: files() }
    const reply = await upload('Time (s),Engine speed (rpm)\n0,800\n1,900\n')
    expect(reply.status).toBe(422)
    expect({ logs: query<{ n: number }>('select count(*) n from logs').n, files: files() }).toEqual(before)
  })

  it('answers 503 with what to do, and keeps no row, when the storage does not take the file', async () => {
    const rows = () => query<{ logs: number, analyses: number, audits: number }>('select (select count(*) from logs) logs, (select count(*) from analyses) analyses, (select count(*) from audit_events where action = \'uploaded\') audits')
    const logs = join(storeDir, 'logs')
    // A file where the driver wants its folder: every put under logs/ fails.
    renameSync(logs, `${logs}.aside`)
    writeFileSync(logs, 'not a folder')
    try {
      const before = rows()
      const reply = await upload(demo.csv)
      expect(reply.status).toBe(503)
      expect(((await reply.json()) as { message: string }).message).toMatch(/could not be stored just now.*Nothing was saved; try again/)
      expect(rows()).toEqual(before)
      expect(readFileSync(logs, 'utf8')).toBe('not a folder')
      const incoming = join(server.dataDir, 'uploads', 'incoming')
      expect(existsSync(incoming) ? readdirSync(incoming) : []).toEqual([])
    }
    finally {
      rmSync(logs)
      renameSync(`${logs}.aside`, logs)
    }
  })
})

describe('a storage driver that is not there', () => {
  it('stops the server at start-up with what to do', async () => {
    await expect(startServer('no-driver', { NUXT_UPLOADS_DRIVER: 'no-such-driver' })).rejects.toThrow(/NUXT_UPLOADS_DRIVER="no-such-driver" is not an unstorage driver/)
  }, 60_000)
})
