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
    // Four 20 MB uploads a moment apart, each on a connection of its own with a true Content-Length.
    const replies = await Promise.all(Array.from({ length: 4 }, (_, i) => new Promise(resolve => setTimeout(resolve, i * 50))
      .then(() => streamUpload({ baseUrl: server.baseUrl, cookie, fields: { vehicleId }, fileName: 'busy.csv', fileBytes: 20 * 1024 * 1024, contentLength: 'true' }))))
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
