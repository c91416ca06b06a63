import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startServer, type RunningServer } from '../setup/server'
import { streamUpload } from './stream-upload'

// A server with one analysis thread and no queue: uploads that arrive while it is busy are
// answered 503 with Retry-After and a plain message, and leave nothing behind.
describe('when the analysis threads are all busy', () => {
  let server: RunningServer
  let cookie = ''
  beforeAll(async () => {
    server = await startServer('busy', { NUXT_ANALYSIS_THREADS: '1', NUXT_ANALYSIS_QUEUE: '0' })
    for (let attempt = 0; attempt < 100 && !cookie; attempt++) {
      const login = await fetch(`${server.baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'origin': server.baseUrl }, body: JSON.stringify({ email: 'tuner@kestrel.test', password: 'densitas-demo' }) })
      cookie = login.ok ? login.headers.get('set-cookie')!.split(';')[0]! : ''
      if (!cookie) await new Promise(r => setTimeout(r, 200))
    }
  })
  afterAll(async () => {
    await server.stop()
  })

  it('answers the uploads it cannot take with 503 and Retry-After, and stores only the others', async () => {
    const db = () => new Database(`${server.dataDir}/densitas.sqlite`, { readonly: true })
    const count = () => {
      const handle = db()
      try {
        return (handle.prepare('select count(*) n from logs').get() as { n: number }).n
      }
      finally {
        handle.close()
      }
    }
    const vehicleId = (() => {
      const handle = db()
      try {
        return (handle.prepare('select id from vehicles order by id limit 1').get() as { id: number }).id
      }
      finally {
        handle.close()
      }
    })()
    // The demo seed's two logs are analysed as the server starts; let it finish.
    for (let attempt = 0; attempt < 100 && count() < 2; attempt++) await new Promise(r => setTimeout(r, 200))
    const before = count()
    // One 40 MB log that reads as a real one (its analysis holds the one thread for a while), and
    // small uploads every 100 ms while it is under way, each on a connection of its own with a true
    // Content-Length: the small uploads that arrive during its analysis find the thread busy.
    const rows = Buffer.from(Array.from({ length: 800_000 }, (_, i) => `${(i * 0.1).toFixed(1)},${2000 + (i % 300) * 10},${i % 600 < 80 ? 100 : 20},${i % 600 < 80 ? 210 : 101},${45 + (i % 600) / 60},${90 + (i % 600) / 20},21.0,${60 + (i % 300) / 10}\n`).join(''))
    const upload = (fileBytes: number, fileRows?: Buffer) => streamUpload({ baseUrl: server.baseUrl, cookie, fields: { vehicleId }, fileName: 'busy.csv', fileBytes, fileRows, contentLength: 'true' })
    let bigDone = false
    const big = upload(rows.length, rows).finally(() => {
      bigDone = true
    })
    const probes: ReturnType<typeof upload>[] = []
    while (!bigDone && probes.length < 300) {
      probes.push(upload(256 * 1024))
      await new Promise(r => setTimeout(r, 100))
    }
    const replies = [await big, ...await Promise.all(probes)]
    const busy = replies.filter(reply => reply.status === 503)
    const stored = replies.filter(reply => reply.status === 201)
    // The one that got the thread is analysed (stored, or refused for its content); none is dropped.
    expect(replies.every(reply => [201, 422, 503].includes(reply.status)), JSON.stringify(replies.map(r => r.status))).toBe(true)
    expect(busy.length).toBeGreaterThanOrEqual(1)
    for (const reply of busy) {
      expect(reply.retryAfter).toBe('60')
      expect(JSON.parse(reply.body).message).toMatch(/busy analysing other logs; try again in a minute/)
    }
    expect(count()).toBe(before + stored.length)
    expect((await fetch(`${server.baseUrl}/api/health`)).status).toBe(200)
  })
})
