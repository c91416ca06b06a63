import { mkdtempSync, rmSync } from 'node:fs'
import { createServer } from 'node:net'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { startServer, type RunningServer } from '../setup/server'
import { Client, DEMO_PASSWORD, freshMember, readDatabase, signIn, uniqueEmail, useTestServer } from './client'

await useTestServer()

// E-mail through real SMTP: the test server has no SMTP_URL, so it delivers to the local mail
// sink it started itself; a second server points SMTP_URL at a closed port to prove retries.

interface Delivery { to: string, status: 'queued' | 'sent' | 'failed', error: string | null }
interface OutboxEntry {
  id: number
  to: string
  subject: string
  kind: string
  status: 'queued' | 'sent' | 'failed'
  error: string | null
  attempts: number
  messageId: string | null
  sentAt: string | null
  createdAt: string
  attachments: Array<{ filename: string, contentType: string, size: number | null, arrived: boolean }>
}

// A few bytes that start like a PDF; the sink only has to carry them, not render them.
const PDF_BYTES = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n')

function writeDatabase<T>(file: string, fn: (db: Database.Database) => T): T {
  const db = new Database(file)
  db.pragma('busy_timeout = 5000')
  try {
    return fn(db)
  }
  finally {
    db.close()
  }
}
const testDatabase = () => join(inject('dataDir'), 'densitas.sqlite')
const workshopId = (slugEmail: string) => readDatabase(db => (db.prepare('select workshop_id id from users where email = ?').get(slugEmail) as { id: number }).id)

function insertMail(file: string, row: { workshopId: number, to: string, kind: string, status?: string, attempts?: number, error?: string | null, attachments?: unknown[], nextAttemptAt?: number | null }) {
  return writeDatabase(file, db => Number(db.prepare(`insert into outbox (workshop_id, to_email, subject, text, kind, status, attempts, error, attachments, next_attempt_at)
    values (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`).run(row.workshopId, row.to, `Test e-mail for ${row.to}`, 'Hello from the test.', row.kind, row.status ?? 'queued', row.attempts ?? 0, row.error ?? null, JSON.stringify(row.attachments ?? []), row.nextAttemptAt ?? null).lastInsertRowid))
}

async function waitFor<T>(what: string, probe: () => Promise<T | undefined> | T | undefined, timeoutMs = 20_000): Promise<T> {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    const value = await probe()
    if (value !== undefined) return value
    await new Promise(r => setTimeout(r, 150))
  }
  throw new Error(`Timed out waiting for ${what}`)
}

async function outboxRow(client: Client | RemoteClient, id: number) {
  const reply = await client.get<OutboxEntry[]>('/api/outbox?limit=100')
  expect(reply.status).toBe(200)
  return reply.body.find(row => row.id === id)
}

// A signed-in client of the second server (the test client is bound to the first one).
class RemoteClient {
  cookie = ''
  constructor(private baseUrl: string) {}
  async request<T>(method: string, path: string, body?: unknown) {
    const headers: Record<string, string> = { 'x-forwarded-for': '203.0.113.7' }
    if (this.cookie) headers.cookie = this.cookie
    if (body !== undefined) headers['content-type'] = 'application/json'
    const response = await fetch(`${this.baseUrl}${path}`, { method, headers, body: body === undefined ? undefined : JSON.stringify(body) })
    const setCookie = response.headers.get('set-cookie')
    if (setCookie) this.cookie = setCookie.split(';')[0]!
    return { status: response.status, body: await response.json() as T }
  }

  get<T>(path: string) {
    return this.request<T>('GET', path)
  }

  post<T>(path: string, body: unknown = {}) {
    return this.request<T>('POST', path, body)
  }
}

// The demo seed finishes shortly after the server answers; sign in once it has.
async function signInRemote(baseUrl: string) {
  const client = new RemoteClient(baseUrl)
  await waitFor('the demo owner to exist', async () => (await client.post('/api/auth/login', { email: 'owner@kestrel.test', password: DEMO_PASSWORD })).status === 200 || undefined)
  return client
}

function closedPort(): Promise<number> {
  return new Promise((done, fail) => {
    const probe = createServer()
    probe.once('error', fail)
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address()
      probe.close(() => typeof address === 'object' && address ? done(address.port) : fail(new Error('no port')))
    })
  })
}

let owner: Client
let fabricator: Client
beforeAll(async () => {
  owner = await signIn('owner@kestrel.test')
  fabricator = await signIn('fab@kestrel.test')
})

describe('delivery to the local mail sink', () => {
  it('e-mails an invitation and says it was sent; the outbox shows it sent with a Message-ID', async () => {
    const email = uniqueEmail('invitee')
    const reply = await owner.post<{ id: number, link: string, mail: Delivery }>('/api/invites', { email, role: 'tuner' })
    expect(reply.status).toBe(201)
    expect(reply.body.mail).toEqual({ to: email, status: 'sent', error: null })
    expect(reply.body.link).toMatch(/\/join\?token=/)
    const id = readDatabase(db => (db.prepare('select id from outbox where to_email = ?').get(email) as { id: number }).id)
    const row = await outboxRow(owner, id)
    expect(row).toMatchObject({ to: email, kind: 'invite', status: 'sent', attempts: 1, error: null, attachments: [] })
    expect(row!.messageId).toMatch(/^<[0-9a-f-]{36}@densitas\.invalid>$/)
    expect(new Date(row!.sentAt!).getTime()).toBeGreaterThan(Date.now() - 60_000)
    // The outbox never shows the message text: an invitation carries a sign-in link.
    expect(row).not.toHaveProperty('text')
  })

  it('delivers a queued message with a PDF attached, and lists the attachment as it arrived', async () => {
    // No route in this branch attaches a PDF yet (quotes do, on their branch): queue one the way
    // queueMail stores it, without a size, so the size shown can only come from the sink's parse.
    const id = insertMail(testDatabase(), {
      workshopId: workshopId('owner@kestrel.test'),
      to: 'driver@kestrel.test',
      kind: 'quote',
      attachments: [{ filename: 'Q-2026-0042.pdf', contentType: 'application/pdf', contentBase64: PDF_BYTES.toString('base64') }],
    })
    // Not nudged by a route: the periodic sweep finds it.
    const row = await waitFor('the PDF e-mail to be sent', async () => {
      const found = await outboxRow(owner, id)
      return found?.status === 'sent' ? found : undefined
    })
    expect(row.attachments).toEqual([{ filename: 'Q-2026-0042.pdf', contentType: 'application/pdf', size: PDF_BYTES.byteLength, arrived: true }])
    // The fabricator follows quote e-mails too.
    expect((await outboxRow(fabricator, id))?.attachments[0]?.filename).toBe('Q-2026-0042.pdf')
  })

  it('says the report link was e-mailed to the customer', async () => {
    const tuner = await signIn('tuner@kestrel.test')
    const logId = readDatabase(db => (db.prepare('select l.id from logs l join users u on u.workshop_id = l.workshop_id where u.email = ? limit 1').get('tuner@kestrel.test') as { id: number }).id)
    const reply = await tuner.post<{ mail: Delivery | null }>(`/api/logs/${logId}/share`, { emailDriver: true })
    expect(reply.status).toBe(201)
    expect(reply.body.mail).toMatchObject({ status: 'sent', error: null })
    const silent = await tuner.post<{ mail: Delivery | null }>(`/api/logs/${logId}/share`, { emailDriver: false })
    expect(silent.body.mail).toBeNull()
  })

  it('sends a password reset without telling the asker whether the address has an account', async () => {
    const known = await new Client().post<{ message: string }>('/api/auth/reset-request', { email: 'driver2@kestrel.test' })
    const unknown = await new Client().post<{ message: string }>('/api/auth/reset-request', { email: uniqueEmail('nobody') })
    expect(known.status).toBe(200)
    expect(known.body).toEqual(unknown.body)
    const id = readDatabase(db => (db.prepare('select id from outbox where to_email = ? and kind = \'password-reset\' order by id desc').get('driver2@kestrel.test') as { id: number }).id)
    await waitFor('the reset e-mail to be sent', async () => (await outboxRow(owner, id))?.status === 'sent' || undefined)
  })

  it('tries a failed e-mail again from the outbox, once', async () => {
    const id = insertMail(testDatabase(), { workshopId: workshopId('owner@kestrel.test'), to: 'tuner@kestrel.test', kind: 'invite', status: 'failed', attempts: 5, error: 'connect ECONNREFUSED 127.0.0.1:1' })
    const audits = () => readDatabase(db => (db.prepare('select count(*) n from audit_events where action = \'retried-email\' and entity_id = ?').get(id) as { n: number }).n)
    const retried = await owner.post<OutboxEntry & { delivery: Delivery }>(`/api/outbox/${id}/retry`)
    expect(retried.status).toBe(200)
    expect(retried.body.delivery).toEqual({ to: 'tuner@kestrel.test', status: 'sent', error: null })
    expect(retried.body).toMatchObject({ status: 'sent', attempts: 1, error: null })
    expect(audits()).toBe(1)
    const again = await owner.post<{ message: string }>(`/api/outbox/${id}/retry`)
    expect(again.status).toBe(409)
    expect(again.body.message).toMatch(/already sent/)
    expect(audits()).toBe(1)
  })
})

describe('who may read the outbox', () => {
  let inviteId: number
  let quoteId: number
  let foreignId: number
  beforeAll(() => {
    const kestrel = workshopId('owner@kestrel.test')
    inviteId = insertMail(testDatabase(), { workshopId: kestrel, to: 'x@example.test', kind: 'invite', status: 'failed', attempts: 5, error: 'refused' })
    quoteId = insertMail(testDatabase(), { workshopId: kestrel, to: 'y@example.test', kind: 'quote', status: 'sent', attempts: 1 })
    foreignId = insertMail(testDatabase(), { workshopId: workshopId('owner@harbourside.test'), to: 'z@example.test', kind: 'invite', status: 'failed', attempts: 5, error: 'refused' })
  })

  it('asks an anonymous visitor to sign in', async () => {
    expect((await new Client().get('/api/outbox')).status).toBe(401)
    expect((await new Client().get('/api/outbox/delivery')).status).toBe(401)
    expect((await new Client().post(`/api/outbox/${inviteId}/retry`)).status).toBe(401)
  })

  it('refuses the tuner and the customer', async () => {
    for (const email of ['tuner@kestrel.test', 'driver@kestrel.test']) {
      const client = await signIn(email)
      const reply = await client.get<{ message: string }>('/api/outbox')
      expect(reply.status).toBe(403)
      expect(reply.body.message).toMatch(/Only the workshop owner/)
      expect((await client.get('/api/outbox/delivery')).status).toBe(403)
      expect((await client.post(`/api/outbox/${inviteId}/retry`)).status).toBe(403)
    }
    // A person who joined as a customer is refused the same way.
    const customer = await freshMember(owner, 'driver')
    expect((await customer.get('/api/outbox')).status).toBe(403)
  })

  it('shows the owner every e-mail of their own workshop, and no other workshop\'s', async () => {
    const reply = await owner.get<OutboxEntry[]>('/api/outbox?limit=100')
    const ids = reply.body.map(row => row.id)
    expect(ids).toEqual(expect.arrayContaining([inviteId, quoteId]))
    expect(ids).not.toContain(foreignId)
    expect(Number(reply.headers.get('x-total-count'))).toBeGreaterThanOrEqual(ids.length)
    const foreign = await signIn('owner@harbourside.test')
    expect((await foreign.get<OutboxEntry[]>('/api/outbox?limit=100')).body.map(row => row.id)).not.toContain(inviteId)
    expect((await foreign.post(`/api/outbox/${inviteId}/retry`)).status).toBe(404)
    expect(readDatabase(db => db.prepare('select status from outbox where id = ?').get(inviteId))).toEqual({ status: 'failed' })
  })

  it('shows the fabricator the quote and payment e-mails only', async () => {
    const reply = await fabricator.get<OutboxEntry[]>('/api/outbox?limit=100')
    expect(reply.status).toBe(200)
    expect(reply.body.map(row => row.id)).toContain(quoteId)
    // Quote e-mails, and the deposit notices other test files may have left; never invitations or resets.
    expect(reply.body.every(row => row.kind === 'quote' || row.kind === 'payment')).toBe(true)
    expect(reply.body.map(row => row.kind)).toContain('quote')
    expect((await fabricator.post(`/api/outbox/${inviteId}/retry`)).status).toBe(404)
  })

  it('pages newest first and filters by status', async () => {
    const first = await owner.get<OutboxEntry[]>('/api/outbox?limit=2')
    const second = await owner.get<OutboxEntry[]>('/api/outbox?limit=2&page=2')
    expect(first.body).toHaveLength(2)
    expect(first.body[0]!.id).toBeGreaterThan(first.body[1]!.id)
    expect(first.body[1]!.id).toBeGreaterThan(second.body[0]!.id)
    const failed = await owner.get<OutboxEntry[]>('/api/outbox?status=failed&limit=100')
    expect(failed.body.length).toBeGreaterThan(0)
    expect(failed.body.every(row => row.status === 'failed')).toBe(true)
  })

  it('searches the address and subject, with the total in X-Total-Count', async () => {
    const all = await owner.get<OutboxEntry[]>('/api/outbox?limit=100')
    const sample = all.body.find(row => row.kind === 'invite')!
    const reply = await owner.get<OutboxEntry[]>(`/api/outbox?limit=100&q=${encodeURIComponent(sample.to.toUpperCase())}`)
    expect(reply.status).toBe(200)
    expect(reply.body.map(row => row.id)).toContain(sample.id)
    expect(reply.body.every(row => row.to.toLowerCase().includes(sample.to.toLowerCase()))).toBe(true)
    expect(Number(reply.headers.get('x-total-count'))).toBe(reply.body.length)
    const bySubject = await owner.get<OutboxEntry[]>('/api/outbox?limit=100&q=invites')
    expect(bySubject.body.length).toBeGreaterThan(0)
    expect(bySubject.body.every(row => /invites/i.test(row.subject) || /invites/i.test(row.to))).toBe(true)
    // A % typed in the box is a percent sign, not "anything".
    const percent = await owner.get<OutboxEntry[]>('/api/outbox?limit=100&q=%25')
    expect(percent.body.every(row => row.subject.includes('%') || row.to.includes('%'))).toBe(true)
    expect(Number(percent.headers.get('x-total-count'))).toBeLessThan(Number(all.headers.get('x-total-count')))
  })

  it('sorts by a fixed key in both directions', async () => {
    const ascending = await owner.get<OutboxEntry[]>('/api/outbox?limit=100&sort=to&dir=asc')
    const addresses = ascending.body.map(row => row.to.toLowerCase())
    expect(addresses).toEqual([...addresses].sort())
    const descending = await owner.get<OutboxEntry[]>('/api/outbox?limit=100&sort=attempts&dir=desc')
    const tries = descending.body.map(row => row.attempts)
    expect(tries).toEqual([...tries].sort((a, b) => b - a))
    const badSort = await owner.get<{ message: string }>('/api/outbox?sort=to_email')
    expect(badSort.status).toBe(400)
    expect(badSort.body.message).toMatch(/sort by one of: queued, to, subject, kind, status, attempts, sent/)
    expect((await owner.get<{ message: string }>('/api/outbox?dir=up')).body.message).toMatch(/the order is asc or desc/)
  })

  it('explains bad paging, filters and ids', async () => {
    const tooMany = await owner.get<{ message: string }>('/api/outbox?limit=500')
    expect(tooMany.status).toBe(400)
    expect(tooMany.body.message).toMatch(/show 1 to 100 e-mails a page/)
    const badStatus = await owner.get<{ message: string }>('/api/outbox?status=lost')
    expect(badStatus.status).toBe(400)
    expect(badStatus.body.message).toMatch(/status is one of queued, sent, failed/)
    expect((await owner.get('/api/outbox?page=0')).status).toBe(400)
    expect((await owner.post('/api/outbox/abc/retry')).status).toBe(400)
    expect((await owner.post('/api/outbox/999999/retry')).status).toBe(404)
  })

  it('tells the owner that e-mail goes to the local mail sink', async () => {
    expect((await owner.get('/api/outbox/delivery')).body).toEqual({ mode: 'sink', from: 'Densitas <no-reply@densitas.invalid>' })
  })
})

describe('with SMTP_URL pointing at a mail server that is down', () => {
  let server: RunningServer
  let folder: string
  let database: string
  let client: RemoteClient
  beforeAll(async () => {
    folder = mkdtempSync(join(tmpdir(), 'densitas-mail-down-'))
    database = join(folder, 'densitas.sqlite')
    server = await startServer('mail-down', { SMTP_URL: `smtp://127.0.0.1:${await closedPort()}`, MAIL_RETRY_DELAYS: '300ms,300ms', DATABASE_URL: database })
    client = await signInRemote(server.baseUrl)
  })
  afterAll(async () => {
    await server?.stop()
    rmSync(folder, { recursive: true, force: true })
  })

  let failedId: number
  it('says the invitation is queued, not sent, then fails it with the error after three tries', async () => {
    const email = uniqueEmail('unlucky')
    const reply = await client.post<{ link: string, mail: Delivery }>('/api/invites', { email, role: 'driver' })
    expect(reply.status).toBe(201)
    expect(reply.body.mail.status).toBe('queued')
    expect(reply.body.mail.error).toMatch(/ECONNREFUSED/)
    expect(reply.body.link).toMatch(/\/join\?token=/)
    failedId = writeDatabase(database, db => (db.prepare('select id from outbox where to_email = ?').get(email) as { id: number }).id)
    const row = await waitFor('the e-mail to fail for good', async () => {
      const found = await outboxRow(client, failedId)
      return found?.status === 'failed' ? found : undefined
    })
    expect(row).toMatchObject({ to: email, status: 'failed', attempts: 3, sentAt: null })
    expect(row.error).toMatch(/ECONNREFUSED/)
    // Nothing lost: the message is still there, whole, to try again.
    const stored = writeDatabase(database, db => db.prepare('select subject, text from outbox where id = ?').get(failedId) as { subject: string, text: string })
    expect(stored.subject).toMatch(/invites you to Densitas/)
    expect(stored.text).toContain(reply.body.link)
    expect((await client.get('/api/outbox/delivery')).body).toMatchObject({ mode: 'smtp' })
  })

  it('says plainly that a try again did not get through either', async () => {
    const retried = await client.post<OutboxEntry & { delivery: Delivery }>(`/api/outbox/${failedId}/retry`)
    expect(retried.status).toBe(200)
    expect(retried.body.delivery.status).toBe('queued')
    expect(retried.body.delivery.error).toMatch(/ECONNREFUSED/)
    await waitFor('the retried e-mail to fail again', async () => (await outboxRow(client, failedId))?.status === 'failed' || undefined)
  })

  it('after a restart with a working mail server, sends what was left queued and nothing twice', async () => {
    await server.stop()
    // As if the process died in the middle of a try: claimed once, its claim window long over.
    const kestrel = writeDatabase(database, db => (db.prepare('select workshop_id id from users where email = ?').get('owner@kestrel.test') as { id: number }).id)
    const leftOver = insertMail(database, { workshopId: kestrel, to: 'left-over@example.test', kind: 'invite', attempts: 1, nextAttemptAt: Date.now() - 1000 })
    server = await startServer('mail-restart', { DATABASE_URL: database })
    client = await signInRemote(server.baseUrl)
    const row = await waitFor('the left-over e-mail to be sent', async () => {
      const found = await outboxRow(client, leftOver)
      return found?.status === 'sent' ? found : undefined
    })
    expect(row.attempts).toBe(2)
    // The message that had failed for good stays failed until someone asks for it again.
    expect((await outboxRow(client, failedId))?.status).toBe('failed')
  })
})
