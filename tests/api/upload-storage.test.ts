import { existsSync, mkdtempSync, readFileSync, readdirSync, renameSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { generateDemoLog } from '../../server/analysis'
import { AwsClient } from 'aws4fetch'
import { startFakeS3, type FakeS3 } from '../setup/fake-s3'
import { startServer, type RunningServer } from '../setup/server'

// Uploaded files go through Nitro's storage layer (server/utils/uploads.ts): a server started with
// another unstorage driver keeps them there and reads them back from there. The driver here is
// fs-lite with its own folder: it is not the fs driver, so every write, read and removal goes
// through the storage calls (setItemRaw, getItemRaw, removeItem), yet the test can look at where
// the files landed. The ordinary uploads folder must stay empty of logs. Then the same through
// the s3 driver against a local S3-compatible store that checks each request's signature.

const demo = generateDemoLog('stock-core-hot-day')

interface SignedIn {
  query: <T>(sql: string, ...params: unknown[]) => T
  call: (method: string, path: string, body?: BodyInit, headers?: Record<string, string>) => Promise<Response>
  upload: (content: string | Uint8Array, fields?: Record<string, string>) => Promise<Response>
}

// Signed in to a server as the demo tuner, uploading for the demo driver's car.
async function signIn(server: RunningServer): Promise<SignedIn> {
  function query<T>(sql: string, ...params: unknown[]): T {
    const db = new Database(`${server.dataDir}/densitas.sqlite`)
    try {
      return (sql.trim().startsWith('select') ? db.prepare(sql).get(...params) : db.prepare(sql).run(...params)) as T
    }
    finally {
      db.close()
    }
  }
  let cookie = ''
  for (let attempt = 0; attempt < 100 && !cookie; attempt++) {
    const login = await fetch(`${server.baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'origin': server.baseUrl }, body: JSON.stringify({ email: 'tuner@kestrel.test', password: 'densitas-demo' }) })
    cookie = login.ok ? login.headers.get('set-cookie')!.split(';')[0]! : ''
    if (!cookie) await new Promise(r => setTimeout(r, 200))
  }
  // The demo seed stores its logs after the users exist; its last step is the demo quote.
  for (let attempt = 0; attempt < 150 && !query<{ n: number }>('select count(*) n from quotes').n; attempt++) await new Promise(r => setTimeout(r, 200))
  const vehicleId = query<{ id: number }>('select v.id from vehicles v join users u on u.id = v.owner_id where u.email = ?', 'driver@kestrel.test').id
  const call: SignedIn['call'] = (method, path, body, headers = {}) => fetch(`${server.baseUrl}${path}`, { method, headers: { cookie, origin: server.baseUrl, ...headers }, body })
  const upload: SignedIn['upload'] = (content, fields = {}) => {
    const form = new FormData()
    form.append('vehicleId', String(vehicleId))
    for (const [key, value] of Object.entries(fields)) form.append(key, value)
    form.append('file', new Blob([typeof content === 'string' ? content : new Uint8Array(content)]), 'hot-day.csv')
    return call('POST', '/api/logs', form)
  }
  return { query, call, upload }
}

describe('uploads kept by another storage driver', () => {
  let server: RunningServer
  let api: SignedIn
  const storeDir = mkdtempSync(join(tmpdir(), 'densitas-elsewhere-'))
  const stored = (id: number) => join(storeDir, 'logs', String(id))

  beforeAll(async () => {
    server = await startServer('storage', { NUXT_UPLOADS_DRIVER: 'fs-lite', NUXT_UPLOADS_OPTIONS: JSON.stringify({ base: storeDir }) })
    api = await signIn(server)
  }, 120_000)
  afterAll(async () => {
    await server?.stop()
    rmSync(storeDir, { recursive: true, force: true })
  })

  it('stores an upload there, gives it back for download and analyses it again from there', async () => {
    const reply = await api.upload(demo.csv)
    expect(reply.status).toBe(201)
    const { id } = await reply.json() as { id: number }
    expect(readFileSync(stored(id), 'utf8')).toBe(demo.csv)
    const ordinary = join(server.dataDir, 'uploads', 'logs')
    expect(existsSync(ordinary) ? readdirSync(ordinary) : []).toEqual([])

    const download = await api.call('GET', `/api/logs/${id}/download`)
    expect(download.status).toBe(200)
    expect(await download.text()).toBe(demo.csv)

    const series = await api.call('GET', `/api/logs/${id}/series?channels=chargeTemp&points=200`)
    expect(series.status).toBe(200)

    // An analysis from an older engine is made again from the stored bytes.
    const fresh = await (await api.call('GET', `/api/logs/${id}/analysis`)).json() as { summary: { pullCount: number } }
    api.query('update analyses set engine_version = ?, result = ? where log_id = ?', '0-old', JSON.stringify({ summary: { pullCount: 99 }, pulls: [] }), id)
    const again = await api.call('GET', `/api/logs/${id}/analysis`)
    expect(again.status).toBe(200)
    expect(((await again.json()) as { summary: { pullCount: number } }).summary.pullCount).toBe(fresh.summary.pullCount)
    expect(fresh.summary.pullCount).toBe(6)

    expect((await api.call('DELETE', `/api/logs/${id}`)).status).toBe(204)
    expect(existsSync(stored(id))).toBe(false)
    expect((await api.call('GET', `/api/logs/${id}/download`)).status).toBe(404)
  })

  it('answers 409 when a stale log\'s file is missing from the storage', async () => {
    const reply = await api.upload(demo.csv)
    const { id } = await reply.json() as { id: number }
    rmSync(stored(id))
    api.query('update analyses set engine_version = ? where log_id = ?', '0-old', id)
    const again = await api.call('GET', `/api/logs/${id}/analysis`)
    expect(again.status).toBe(409)
    expect((await api.call('GET', `/api/logs/${id}/download`)).status).toBe(404)
  })

  it('leaves neither row nor file behind when the log is refused', async () => {
    const files = () => readdirSync(join(storeDir, 'logs')).sort()
    const before = { logs: api.query<{ n: number }>('select count(*) n from logs').n, files: files() }
    const reply = await api.upload('Time (s),Engine speed (rpm)\n0,800\n1,900\n')
    expect(reply.status).toBe(422)
    expect({ logs: api.query<{ n: number }>('select count(*) n from logs').n, files: files() }).toEqual(before)
  })

  it('answers 503 with what to do, and keeps no row, when the storage does not take the file', async () => {
    const rows = () => api.query<{ logs: number, analyses: number, audits: number }>('select (select count(*) from logs) logs, (select count(*) from analyses) analyses, (select count(*) from audit_events where action = \'uploaded\') audits')
    const logs = join(storeDir, 'logs')
    // A file where the driver wants its folder: every put under logs/ fails.
    renameSync(logs, `${logs}.aside`)
    writeFileSync(logs, 'not a folder')
    try {
      const before = rows()
      const reply = await api.upload(demo.csv)
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

// The same with the s3 driver against a local S3-compatible store (tests/setup/fake-s3.ts), which
// checks every request's signature: configuration alone, nothing of ours replaced.
describe('uploads kept in S3-compatible storage', () => {
  let fake: FakeS3
  let server: RunningServer

  beforeAll(async () => {
    fake = await startFakeS3()
    const options = { endpoint: fake.endpoint, region: fake.region, bucket: fake.bucket, accessKeyId: fake.accessKeyId, secretAccessKey: fake.secretAccessKey }
    server = await startServer('s3', { NUXT_UPLOADS_DRIVER: 's3', NUXT_UPLOADS_OPTIONS: JSON.stringify(options) })
  }, 120_000)
  afterAll(async () => {
    await server?.stop()
    await fake?.stop()
  })

  it('refuses requests that are not signed with its key', async () => {
    // A key no log ever has: the server's demo seed is storing logs/1, logs/2… in this bucket meanwhile.
    const url = `${fake.endpoint}/${fake.bucket}/logs/no-such-log`
    expect((await fetch(url)).status).toBe(403)
    const wrongSecret = await new AwsClient({ service: 's3', region: fake.region, accessKeyId: fake.accessKeyId, secretAccessKey: 'not-the-secret' }).fetch(url)
    expect(wrongSecret.status).toBe(403)
    expect(await wrongSecret.text()).toContain('SignatureDoesNotMatch')
    const rightSecret = await new AwsClient({ service: 's3', region: fake.region, accessKeyId: fake.accessKeyId, secretAccessKey: fake.secretAccessKey }).fetch(url)
    expect(rightSecret.status).toBe(404)
  })

  it('puts an upload in the bucket under logs/<id>, gives it back, analyses it again from there and deletes it with the log', async () => {
    const api = await signIn(server)
    const reply = await api.upload(demo.csv)
    expect(reply.status).toBe(201)
    const { id } = await reply.json() as { id: number }
    expect(fake.objects.get(`logs/${id}`)?.toString('utf8')).toBe(demo.csv)
    expect(fake.requests).toContainEqual({ method: 'PUT', path: `/${fake.bucket}/logs/${id}`, status: 200 })
    const ordinary = join(server.dataDir, 'uploads', 'logs')
    expect(existsSync(ordinary) ? readdirSync(ordinary) : []).toEqual([])

    const download = await api.call('GET', `/api/logs/${id}/download`)
    expect(download.status).toBe(200)
    expect(await download.text()).toBe(demo.csv)

    // An analysis from an older engine is made again from the bytes in the bucket.
    const fresh = await (await api.call('GET', `/api/logs/${id}/analysis`)).json() as { summary: { pullCount: number } }
    expect(fresh.summary.pullCount).toBe(6)
    api.query('update analyses set engine_version = ?, result = ? where log_id = ?', '0-old', JSON.stringify({ summary: { pullCount: 99 }, pulls: [] }), id)
    const readsBefore = fake.requests.filter(r => r.method === 'GET' && r.path === `/${fake.bucket}/logs/${id}`).length
    const again = await api.call('GET', `/api/logs/${id}/analysis`)
    expect(again.status).toBe(200)
    expect(((await again.json()) as { summary: { pullCount: number } }).summary.pullCount).toBe(6)
    expect(fake.requests.filter(r => r.method === 'GET' && r.path === `/${fake.bucket}/logs/${id}`).length).toBeGreaterThan(readsBefore)

    expect((await api.call('DELETE', `/api/logs/${id}`)).status).toBe(204)
    expect(fake.objects.has(`logs/${id}`)).toBe(false)
    expect(fake.requests).toContainEqual({ method: 'DELETE', path: `/${fake.bucket}/logs/${id}`, status: 204 })
    expect((await api.call('GET', `/api/logs/${id}/download`)).status).toBe(404)
  })

  it('answers 503 with what to do, and keeps no row and no object, when the bucket refuses the credentials', async () => {
    const api = await signIn(server)
    const rows = () => api.query<{ logs: number, analyses: number, audits: number }>('select (select count(*) from logs) logs, (select count(*) from analyses) analyses, (select count(*) from audit_events where action = \'uploaded\') audits')
    const before = { rows: rows(), objects: [...fake.objects.keys()] }
    // The key the server was started with is no longer the bucket's (rotated at the provider).
    const secret = fake.secretAccessKey
    fake.secretAccessKey = 'rotated-secret-the-server-does-not-know'
    try {
      const refusedBefore = fake.requests.filter(r => r.status === 403).length
      const reply = await api.upload(demo.csv)
      expect(reply.status).toBe(503)
      expect(((await reply.json()) as { message: string }).message).toMatch(/could not be stored just now.*Nothing was saved; try again/)
      expect(fake.requests.filter(r => r.status === 403).length).toBeGreaterThan(refusedBefore)
    }
    finally {
      fake.secretAccessKey = secret
    }
    expect({ rows: rows(), objects: [...fake.objects.keys()] }).toEqual(before)
    const incoming = join(server.dataDir, 'uploads', 'incoming')
    expect(existsSync(incoming) ? readdirSync(incoming) : []).toEqual([])
    // With the key right again, the same upload is kept.
    expect((await api.upload(demo.csv)).status).toBe(201)
  })

  it('answers 503 with what to do, not 500, when a stored file cannot be read back', async () => {
    const api = await signIn(server)
    const reply = await api.upload(demo.csv)
    const { id } = await reply.json() as { id: number }
    api.query('update analyses set engine_version = ? where log_id = ?', '0-old', id)
    const secret = fake.secretAccessKey
    fake.secretAccessKey = 'rotated-secret-the-server-does-not-know'
    try {
      for (const path of [`/api/logs/${id}/download`, `/api/logs/${id}/analysis`]) {
        const refused = await api.call('GET', path)
        expect(refused.status, path).toBe(503)
        expect(((await refused.json()) as { message: string }).message).toMatch(/could not be read from the file storage just now.*try again in a minute/)
      }
    }
    finally {
      fake.secretAccessKey = secret
    }
    expect(fake.objects.get(`logs/${id}`)?.toString('utf8')).toBe(demo.csv)
    const download = await api.call('GET', `/api/logs/${id}/download`)
    expect(download.status).toBe(200)
    expect(await download.text()).toBe(demo.csv)
    expect((await api.call('GET', `/api/logs/${id}/analysis`)).status).toBe(200)
  })
})
