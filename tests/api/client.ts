import { randomUUID } from 'node:crypto'
import { existsSync, readdirSync } from 'node:fs'
import { join } from 'node:path'
import { fetch as testFetch, setup } from '@nuxt/test-utils/e2e'
import Database from 'better-sqlite3'
import { inject } from 'vitest'

export const DEMO_PASSWORD = 'densitas-demo'
export const MEMBER_PASSWORD = 'correct horse battery'

// Point @nuxt/test-utils at the server the global setup started (no second build).
export async function useTestServer() {
  await setup({ host: inject('baseUrl') })
}

export interface Reply<T = unknown> {
  status: number
  body: T
  headers: Headers
}

async function toReply<T>(response: Response): Promise<Reply<T>> {
  const text = await response.text()
  let parsed: unknown = text
  try {
    parsed = text ? JSON.parse(text) : null
  }
  catch {
    // not JSON (a download, a CSV): keep the text
  }
  return { status: response.status, body: parsed as T, headers: response.headers }
}

// Each signed-in client gets its own cookie jar and its own client address.
export class Client {
  cookie = ''
  constructor(public address = `198.51.100.${Math.floor(Math.random() * 250) + 1}`) {}

  async request<T = unknown>(method: string, path: string, body?: unknown): Promise<Reply<T>> {
    const headers: Record<string, string> = { 'x-forwarded-for': this.address }
    if (this.cookie) headers.cookie = this.cookie
    if (body !== undefined) headers['content-type'] = 'application/json'
    const response = await testFetch(path, { method, headers, body: body === undefined ? undefined : JSON.stringify(body), redirect: 'manual' })
    const setCookie = response.headers.get('set-cookie')
    if (setCookie) this.cookie = setCookie.split(';')[0]!
    return toReply<T>(response)
  }

  // multipart/form-data, as the upload page sends it.
  async upload<T = unknown>(path: string, fields: Record<string, string | number | undefined>, file?: { name: string, content: string | Uint8Array }): Promise<Reply<T>> {
    const form = new FormData()
    for (const [key, value] of Object.entries(fields)) {
      if (value !== undefined) form.append(key, String(value))
    }
    if (file) form.append('file', new Blob([typeof file.content === 'string' ? file.content : new Uint8Array(file.content)]), file.name)
    const headers: Record<string, string> = { 'x-forwarded-for': this.address }
    if (this.cookie) headers.cookie = this.cookie
    return toReply<T>(await testFetch(path, { method: 'POST', headers, body: form }))
  }

  // Any body and headers, as a browser or another program might send them (cookie and client address added).
  async send<T = unknown>(method: string, path: string, init: { headers?: Record<string, string>, body?: BodyInit } = {}): Promise<Reply<T>> {
    const headers: Record<string, string> = { 'x-forwarded-for': this.address, ...init.headers }
    if (this.cookie) headers.cookie = this.cookie
    return toReply<T>(await testFetch(path, { method, headers, body: init.body, redirect: 'manual' }))
  }

  // The start of a log as bytes, as the upload page sends it for detection.
  detect<T = unknown>(sample: string | Uint8Array, fileName = 'log.csv') {
    const body = typeof sample === 'string' ? new TextEncoder().encode(sample) : sample
    return this.send<T>('POST', `/api/logs/detect?fileName=${encodeURIComponent(fileName)}`, { headers: { 'content-type': 'application/octet-stream' }, body: new Uint8Array(body) })
  }

  get<T = unknown>(path: string) {
    return this.request<T>('GET', path)
  }

  post<T = unknown>(path: string, body?: unknown) {
    return this.request<T>('POST', path, body ?? {})
  }

  patch<T = unknown>(path: string, body: unknown) {
    return this.request<T>('PATCH', path, body)
  }

  delete<T = unknown>(path: string) {
    return this.request<T>('DELETE', path)
  }
}

export async function signIn(email: string, password = DEMO_PASSWORD) {
  const client = new Client()
  const reply = await client.post('/api/auth/login', { email, password })
  if (reply.status !== 200) throw new Error(`sign-in of ${email} failed: ${reply.status} ${JSON.stringify(reply.body)}`)
  return client
}

export function uniqueEmail(prefix = 'person') {
  return `${prefix}-${randomUUID().slice(0, 8)}@example.test`
}

// Read-only look into the test server's database, to prove that nothing half-written stays behind.
export function readDatabase<T>(fn: (db: Database.Database) => T): T {
  const db = new Database(`${inject('dataDir')}/densitas.sqlite`, { readonly: true })
  try {
    return fn(db)
  }
  finally {
    db.close()
  }
}

// What a failed request must not leave behind: rows in the log tables and files in the uploads folder.
export function logFootprint() {
  const count = (table: string) => readDatabase(db => (db.prepare(`select count(*) n from ${table}`).get() as { n: number }).n)
  const folder = join(inject('dataDir'), 'uploads', 'logs')
  const files = existsSync(folder) ? readdirSync(folder).length : 0
  return { logs: count('logs'), analyses: count('analyses'), files }
}

// The token of the newest link e-mailed to an address (the outbox holds every message).
export function lastMailedToken(email: string): string {
  const row = readDatabase(db => db.prepare('select text from outbox where to_email = ? order by id desc limit 1').get(email) as { text: string } | undefined)
  const match = row && /token=([\w-]+)/.exec(row.text)
  if (!match) throw new Error(`no link mailed to ${email}`)
  return match[1]!
}

// Invite a fresh person with the given role and let them join; returns their signed-in client.
export async function freshMember(owner: Client, role: 'owner' | 'tuner' | 'fabricator' | 'driver') {
  const email = uniqueEmail(role)
  const invite = await owner.post('/api/invites', { email, role })
  if (invite.status !== 201) throw new Error(`invite failed: ${JSON.stringify(invite.body)}`)
  const client = new Client()
  const joined = await client.post<{ user: { id: number } }>('/api/invites/accept', { token: lastMailedToken(email), name: `Test ${role}`, password: MEMBER_PASSWORD })
  if (joined.status !== 201) throw new Error(`join failed: ${JSON.stringify(joined.body)}`)
  return Object.assign(client, { id: joined.body.user.id, email })
}
