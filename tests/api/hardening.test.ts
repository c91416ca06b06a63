import { request } from 'node:http'
import { seal, unseal, defaults } from 'iron-webcrypto'
import { describe, expect, inject, it } from 'vitest'
import { Client, DEMO_PASSWORD, MEMBER_PASSWORD, freshMember, lastMailedToken, logFootprint, readDatabase, signIn, uniqueEmail, useTestServer } from './client'

await useTestServer()

// Issue 7 (hardening): sessions that end, patches that touch only what is sent, cross-site and
// oversized requests refused, reset and invitation details, headers, races, the shared report.

const SESSION_PASSWORD = 'test-only-session-password-0123456789abcdef'
const DAY_MS = 86_400_000

const count = (sql: string, ...args: unknown[]) => readDatabase(db => (db.prepare(sql).get(...args) as { n: number }).n)
const row = (sql: string, ...args: unknown[]) => readDatabase(db => db.prepare(sql).get(...args) as Record<string, unknown>)
const firstLogId = () => (row('select id from logs order by id limit 1') as { id: number }).id

function withCookie(cookie: string) {
  const client = new Client()
  client.cookie = cookie
  return client
}

// Rewrites the sealed session in a cookie, as someone holding the session secret could; used to
// age a sign-in without waiting two weeks.
const ironCrypto = globalThis.crypto as unknown as Parameters<typeof seal>[0]

async function rewriteSession(cookie: string, change: (session: { createdAt: number, data: Record<string, unknown> }) => void) {
  const [name, value] = cookie.split('=') as [string, string]
  const session = await unseal(ironCrypto, decodeURIComponent(value), SESSION_PASSWORD, { ...defaults, ttl: 0 }) as { createdAt: number, data: Record<string, unknown> }
  change(session)
  return `${name}=${encodeURIComponent(await seal(ironCrypto, session, SESSION_PASSWORD, { ...defaults, ttl: 0 }))}`
}

describe('sign-out ends the session', () => {
  it('refuses the old cookie after sign-out, for reading and for writing', async () => {
    const tuner = await signIn('tuner@kestrel.test')
    const kept = tuner.cookie
    expect((await tuner.get('/api/me')).status).toBe(200)
    expect((await tuner.post('/api/auth/logout')).status).toBe(200)

    // A fresh copy each time: a 401 also clears the cookie in the client that got it.
    expect((await withCookie(kept).get('/api/me')).status).toBe(401)
    const before = count('select count(*) n from share_links')
    expect((await withCookie(kept).post(`/api/logs/${firstLogId()}/share`, { expiresInDays: 3 })).status).toBe(401)
    expect(count('select count(*) n from share_links')).toBe(before)
    // The page's own session check does not show the person as signed in either.
    expect((await withCookie(kept).get('/api/_auth/session')).status).toBe(401)
  })

  it('keeps other devices signed in after a plain sign-out, and ends them all with "everywhere"', async () => {
    const phone = await signIn('driver2@kestrel.test')
    const laptop = await signIn('driver2@kestrel.test')
    const tablet = await signIn('driver2@kestrel.test')
    await phone.post('/api/auth/logout')
    expect((await laptop.get('/api/me')).status).toBe(200)

    const laptopCookie = laptop.cookie
    expect((await laptop.post('/api/auth/logout', { everywhere: true })).status).toBe(200)
    expect((await tablet.get('/api/me')).status).toBe(401)
    expect((await withCookie(laptopCookie).get('/api/me')).status).toBe(401)
    // A new sign-in works as before.
    expect((await (await signIn('driver2@kestrel.test')).get('/api/me')).status).toBe(200)
  })

  it('ends the other sessions on a password change and keeps this one', async () => {
    const member = await freshMember(await signIn('owner@kestrel.test'), 'tuner')
    const other = await signIn(member.email, MEMBER_PASSWORD)
    const oldCookie = member.cookie
    expect((await member.post('/api/auth/password', { currentPassword: MEMBER_PASSWORD, newPassword: 'a brand new password' })).status).toBe(200)
    expect((await member.get('/api/me')).status).toBe(200)
    expect((await other.get('/api/me')).status).toBe(401)
    expect((await withCookie(oldCookie).get('/api/me')).status).toBe(401)
  })

  it('ends every session on a password reset', async () => {
    const member = await freshMember(await signIn('owner@kestrel.test'), 'driver')
    const other = await signIn(member.email, MEMBER_PASSWORD)
    await new Client().post('/api/auth/reset-request', { email: member.email })
    const reset = await new Client().post('/api/auth/reset', { token: lastMailedToken(member.email), password: 'reset password here' })
    expect(reset.status).toBe(200)
    expect((await member.get('/api/me')).status).toBe(401)
    expect((await other.get('/api/me')).status).toBe(401)
  })

  it('refuses a sign-in older than the maximum age, even in a freshly sealed cookie', async () => {
    const client = await signIn('fab@kestrel.test')
    expect((await client.get('/api/me')).status).toBe(200)
    const aged = await rewriteSession(client.cookie, (session) => {
      session.data.loggedInAt = Date.now() - 15 * DAY_MS
    })
    const reply = await withCookie(aged).get<{ message: string }>('/api/me')
    expect(reply.status).toBe(401)
    expect(reply.body.message).toBe('Your sign-in has expired. Sign in again.')
    // The same cookie with its real sign-in time still works: only the age made the difference.
    const fresh = await rewriteSession(client.cookie, () => {})
    expect((await withCookie(fresh).get('/api/me')).status).toBe(200)
  })

  it('refuses a cookie sealed more than the maximum age ago', async () => {
    const client = await signIn('fab@kestrel.test')
    const old = await rewriteSession(client.cookie, (session) => {
      session.createdAt = Date.now() - 15 * DAY_MS
    })
    expect((await withCookie(old).get('/api/me')).status).toBe(401)
  })

  it('gives the session cookie an expiry', async () => {
    const client = new Client()
    const { headers } = await client.post('/api/auth/login', { email: 'fab@kestrel.test', password: DEMO_PASSWORD })
    const expires = /expires=([^;]+)/i.exec(headers.get('set-cookie') ?? '')
    expect(expires).not.toBeNull()
    const days = (Date.parse(expires![1]!) - Date.now()) / DAY_MS
    expect(days).toBeGreaterThan(13)
    expect(days).toBeLessThanOrEqual(14)
  })
})

describe('a patch writes only the keys sent', () => {
  const withoutTimes = (value: Record<string, unknown>) => {
    const { updated_at: _u, ...rest } = value
    return rest
  }

  it('PATCH /api/vehicles/:id with one field keeps every other column', async () => {
    const tuner = await signIn('tuner@kestrel.test')
    const car = row('select * from vehicles where registration = ?', 'KRP·0421')
    expect(car.notes).not.toBe('')
    expect(car.fitted_core_id).not.toBeNull()
    const reply = await tuner.patch(`/api/vehicles/${car.id}`, { cylinders: 5 })
    expect(reply.status).toBe(200)
    const after = row('select * from vehicles where id = ?', car.id)
    expect(withoutTimes(after)).toEqual({ ...withoutTimes(car), cylinders: 5 })
    await tuner.patch(`/api/vehicles/${car.id}`, { cylinders: car.cylinders })
  })

  it('PATCH /api/workshop with one field keeps every other column', async () => {
    const owner = await signIn('owner@harbourside.test')
    const before = row('select * from workshops where slug = ?', 'harbourside')
    expect((await owner.patch('/api/workshop', { labourRateCents: 7300 })).status).toBe(200)
    expect(row('select * from workshops where id = ?', before.id)).toEqual({ ...before, labour_rate_cents: 7300 })
    const empty = await owner.patch<{ message: string }>('/api/workshop', {})
    expect(empty.status).toBe(400)
    expect(empty.body.message).toBe('Nothing to change: send the name, currency, labour rate, deposit share, tax rate, quote validity or quote terms.')
  })

  it('PATCH /api/me with one field keeps every other column', async () => {
    const member = await freshMember(await signIn('owner@kestrel.test'), 'driver')
    await member.patch('/api/me', { preferences: { temperature: 'F', power: 'PS' } })
    const before = row('select * from users where id = ?', member.id)
    expect((await member.patch('/api/me', { name: 'Renamed Person' })).status).toBe(200)
    expect(row('select * from users where id = ?', member.id)).toEqual({ ...before, name: 'Renamed Person' })
    const nothing = await member.patch<{ message: string }>('/api/me', {})
    expect(nothing.status).toBe(400)
    expect(nothing.body.message).toBe('Nothing to change: send your name or your display units.')
  })

  it('PATCH /api/members/:id with the role keeps every other column', async () => {
    const owner = await signIn('owner@kestrel.test')
    const member = await freshMember(owner, 'fabricator')
    const before = row('select * from users where id = ?', member.id)
    expect((await owner.patch(`/api/members/${member.id}`, { role: 'tuner' })).status).toBe(200)
    expect(row('select * from users where id = ?', member.id)).toEqual({ ...before, role: 'tuner' })
  })

  it('PATCH /api/logs/:id with the notes keeps every other column and the analysis', async () => {
    const tuner = await signIn('tuner@kestrel.test')
    const id = firstLogId()
    const before = row('select * from logs where id = ?', id)
    const analysis = row('select * from analyses where log_id = ?', id)
    expect((await tuner.patch(`/api/logs/${id}`, { notes: 'only the notes changed' })).status).toBe(200)
    expect(row('select * from logs where id = ?', id)).toEqual({ ...before, notes: 'only the notes changed' })
    expect(row('select * from analyses where log_id = ?', id)).toEqual(analysis)
  })
})

describe('cross-site requests', () => {
  it('refuses a form posted from another site with the owner\'s cookie, and writes nothing', async () => {
    const owner = await signIn('owner@kestrel.test')
    const before = count('select count(*) n from invites')
    const reply = await owner.send<{ message: string }>('POST', '/api/invites', {
      headers: { 'origin': 'http://evil.example', 'content-type': 'application/x-www-form-urlencoded' },
      body: `email=${encodeURIComponent(uniqueEmail('outsider'))}&role=owner`,
    })
    expect(reply.status).toBe(403)
    expect(reply.body.message).toMatch(/another website/)
    expect(count('select count(*) n from invites')).toBe(before)
  })

  it('refuses a request a browser marks as cross-site, even without an Origin', async () => {
    const owner = await signIn('owner@kestrel.test')
    const before = count('select count(*) n from invites')
    const reply = await owner.send('POST', '/api/invites', {
      headers: { 'sec-fetch-site': 'cross-site', 'content-type': 'application/json' },
      body: JSON.stringify({ email: uniqueEmail('outsider'), role: 'owner' }),
    })
    expect(reply.status).toBe(403)
    expect(count('select count(*) n from invites')).toBe(before)
  })

  it('refuses a multipart upload from another site', async () => {
    const tuner = await signIn('tuner@kestrel.test')
    const before = logFootprint()
    const car = (row('select id from vehicles where registration = ?', 'KRP·0421') as { id: number }).id
    const form = new FormData()
    form.append('vehicleId', String(car))
    form.append('file', new Blob(['time,iat\n0,20\n1,21\n']), 'x.csv')
    const reply = await tuner.send('POST', '/api/logs', { headers: { origin: 'https://evil.example' }, body: form })
    expect(reply.status).toBe(403)
    expect(logFootprint()).toEqual(before)
  })

  it('accepts the same request from the app\'s own pages', async () => {
    const owner = await signIn('owner@kestrel.test')
    const reply = await owner.send('POST', '/api/invites', {
      headers: { 'origin': inject('baseUrl'), 'sec-fetch-site': 'same-origin', 'content-type': 'application/json' },
      body: JSON.stringify({ email: uniqueEmail('welcome'), role: 'driver' }),
    })
    expect(reply.status).toBe(201)
  })

  it('takes JSON only on JSON routes (415 with a message), from any origin', async () => {
    const owner = await signIn('owner@kestrel.test')
    const before = count('select count(*) n from invites')
    const reply = await owner.send<{ message: string }>('POST', '/api/invites', {
      headers: { 'content-type': 'text/plain' },
      body: JSON.stringify({ email: uniqueEmail('plain'), role: 'driver' }),
    })
    expect(reply.status).toBe(415)
    expect(reply.body.message).toBe('Send the request body as JSON (Content-Type: application/json).')
    expect(count('select count(*) n from invites')).toBe(before)
  })
})

describe('body and field limits', () => {
  // Sends up to `totalBytes` of JSON-ish bytes and takes the answer as soon as it comes (node:http
  // reads an answer while still sending, as a browser does).
  function sendLarge(path: string, totalBytes: number, chunked: boolean, prefix = '') {
    return new Promise<{ status: number, body: string, sentBytes: number, ms: number }>((resolve, reject) => {
      const started = performance.now()
      const url = new URL(path, inject('baseUrl'))
      const req = request(url, {
        method: 'POST',
        headers: { 'content-type': 'application/json', ...(chunked ? {} : { 'content-length': String(totalBytes) }) },
      })
      let sentBytes = 0
      let answered = false
      const chunk = Buffer.alloc(256 * 1024, 0x61)
      const pump = () => {
        if (sentBytes === 0 && prefix) {
          sentBytes += Buffer.byteLength(prefix)
          req.write(prefix)
        }
        while (!answered && sentBytes < totalBytes) {
          const part = chunk.subarray(0, Math.min(chunk.length, totalBytes - sentBytes))
          sentBytes += part.length
          if (!req.write(part)) return req.once('drain', pump)
        }
        if (!answered) req.end()
      }
      req.on('response', (response) => {
        answered = true
        let body = ''
        response.setEncoding('utf8')
        response.on('data', (text: string) => {
          body += text
        })
        response.on('end', () => resolve({ status: response.statusCode ?? 0, body, sentBytes, ms: performance.now() - started }))
        response.on('error', reject)
      })
      // The server closes the connection after its answer; writes after that fail, which is expected.
      req.on('error', error => answered ? undefined : reject(error))
      pump()
    })
  }

  it('answers a 150 MB JSON body with 413 before it is sent, keeping none of it', async () => {
    const reply = await sendLarge('/api/auth/reset-request', 150 * 1024 * 1024, false)
    expect(reply.status).toBe(413)
    expect(reply.body).toMatch(/too large/)
    expect(reply.sentBytes).toBeLessThan(150 * 1024 * 1024)
    expect((await fetch(`${inject('baseUrl')}/api/health`)).status).toBe(200)
  })

  it('stops reading a chunked body (no Content-Length) at the limit', async () => {
    const reply = await sendLarge('/api/auth/reset-request', 150 * 1024 * 1024, true, '{"email":"')
    expect(reply.status).toBe(413)
    expect(reply.body).toMatch(/too large/)
    expect(reply.sentBytes).toBeLessThan(150 * 1024 * 1024)
    expect((await fetch(`${inject('baseUrl')}/api/health`)).status).toBe(200)
  })

  it('answers a 20 MB e-mail address with 413 and a 300-character one with 400', async () => {
    const long = await sendLarge('/api/auth/login', 20 * 1024 * 1024, true, '{"password":"x","email":"')
    expect(long.status).toBe(413)
    const tooLong = await new Client().post<{ message: string }>('/api/auth/reset-request', { email: `${'a'.repeat(300)}@example.test` })
    expect(tooLong.status).toBe(400)
    expect(tooLong.body.message).toMatch(/at most 254 characters/)
  })

  it('limits the length of names and notes', async () => {
    const tuner = await signIn('tuner@kestrel.test')
    const car = (row('select id from vehicles where registration = ?', 'KRP·0421') as { id: number }).id
    const reply = await tuner.patch<{ message: string }>(`/api/vehicles/${car}`, { notes: 'x'.repeat(2001) })
    expect(reply.status).toBe(400)
    expect(reply.body.message).toMatch(/2000 characters/)
    expect((await tuner.patch('/api/me', { name: 'n'.repeat(121) })).status).toBe(400)
  })
})

describe('password reset links', () => {
  it('closes the person\'s other reset links once one is used', async () => {
    const member = await freshMember(await signIn('owner@kestrel.test'), 'driver')
    await new Client().post('/api/auth/reset-request', { email: member.email })
    const first = lastMailedToken(member.email)
    await new Client().post('/api/auth/reset-request', { email: member.email })
    const second = lastMailedToken(member.email)
    expect(second).not.toBe(first)
    expect((await new Client().post('/api/auth/reset', { token: second, password: 'second link password' })).status).toBe(200)
    const stale = await new Client().post<{ message: string }>('/api/auth/reset', { token: first, password: 'first link password' })
    expect(stale.status).toBe(400)
    expect(stale.body.message).toMatch(/expired or was already used/)
  })

  it('sends at most 3 reset e-mails per address an hour, with the same answer every time', async () => {
    const member = await freshMember(await signIn('owner@kestrel.test'), 'driver')
    const replies = []
    for (let i = 0; i < 5; i++) replies.push(await new Client().post<{ message: string }>('/api/auth/reset-request', { email: member.email }))
    expect(new Set(replies.map(r => `${r.status} ${r.body.message}`)).size).toBe(1)
    expect(count('select count(*) n from outbox where to_email = ? and kind = \'password-reset\'', member.email)).toBe(3)
  })

  it('throttles reset requests from one client', async () => {
    const client = new Client('203.0.113.91')
    for (let i = 0; i < 20; i++) {
      expect((await client.post('/api/auth/reset-request', { email: uniqueEmail('flood') })).status).toBe(200)
    }
    const refused = await client.post<{ message: string }>('/api/auth/reset-request', { email: uniqueEmail('flood') })
    expect(refused.status).toBe(429)
    expect(refused.body.message).toMatch(/Too many reset requests/)
  })
})

describe('known and unknown addresses look alike', () => {
  const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!
  async function timed(fn: () => Promise<unknown>) {
    const started = performance.now()
    await fn()
    return performance.now() - started
  }

  it('takes as long to answer a reset request for an unknown address as for a known one', async () => {
    const member = await freshMember(await signIn('owner@kestrel.test'), 'driver')
    const known: number[] = []
    const unknown: number[] = []
    for (let i = 0; i < 3; i++) {
      known.push(await timed(() => new Client().post('/api/auth/reset-request', { email: member.email })))
      unknown.push(await timed(() => new Client().post('/api/auth/reset-request', { email: uniqueEmail('ghost') })))
    }
    // Both answer no sooner than the floor, whatever work there was behind the address.
    expect(Math.min(...known, ...unknown)).toBeGreaterThanOrEqual(240)
    expect(median(unknown) / median(known)).toBeGreaterThan(0.6)
    expect(median(unknown) / median(known)).toBeLessThan(1.6)
  })

  it('takes as long to refuse an unknown address at sign-in as a wrong password', async () => {
    const member = await freshMember(await signIn('owner@kestrel.test'), 'driver')
    const known: number[] = []
    const unknown: number[] = []
    for (let i = 0; i < 4; i++) {
      known.push(await timed(() => new Client().post('/api/auth/login', { email: member.email, password: `wrong-${i}` })))
      unknown.push(await timed(() => new Client().post('/api/auth/login', { email: uniqueEmail('ghost'), password: 'wrong' })))
    }
    // Generous factor: both spend one scrypt; without the dummy hash the unknown one took a fraction.
    expect(median(unknown) / median(known)).toBeGreaterThan(0.5)
    expect(median(unknown) / median(known)).toBeLessThan(2)
  })
})

describe('headers', () => {
  it('sends a content security policy, frame and sniffing protection on pages, and no x-powered-by', async () => {
    const page = await new Client().get<string>('/login')
    expect(page.status).toBe(200)
    const csp = page.headers.get('content-security-policy') ?? ''
    expect(csp).toMatch(/frame-ancestors 'none'/)
    expect(csp).toMatch(/script-src 'self' 'sha256-/)
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/)
    expect(page.headers.get('x-frame-options')).toBe('DENY')
    expect(page.headers.get('x-content-type-options')).toBe('nosniff')
    expect(page.headers.get('referrer-policy')).toBe('same-origin')
    expect(page.headers.get('x-powered-by')).toBeNull()
  })

  it('sends no referrer from a shared report page', async () => {
    const page = await new Client().get('/shared/not-a-real-token-0123456789')
    expect(page.headers.get('referrer-policy')).toBe('no-referrer')
    expect(page.headers.get('x-frame-options')).toBe('DENY')
  })

  it('keeps private JSON out of caches, but not the health check', async () => {
    const driver = await signIn('driver@kestrel.test')
    for (const path of ['/api/me', '/api/vehicles', '/api/members']) {
      const reply = await driver.get(path)
      expect(reply.headers.get('cache-control'), path).toMatch(/no-store/)
      expect(reply.headers.get('x-content-type-options'), path).toBe('nosniff')
      expect(reply.headers.get('x-powered-by'), path).toBeNull()
    }
    expect((await new Client().get('/api/health')).headers.get('cache-control') ?? '').not.toMatch(/no-store/)
  })

  it('sends nosniff with static files too', async () => {
    const page = await new Client().get<string>('/login')
    const script = /src="(\/_nuxt\/[^"]+\.js)"/.exec(page.body)![1]!
    const asset = await new Client().get(script)
    expect(asset.status).toBe(200)
    expect(asset.headers.get('x-content-type-options')).toBe('nosniff')
  })
})

describe('races', () => {
  it('answers five simultaneous accepts of one invitation with one 201 and four 409', async () => {
    const owner = await signIn('owner@kestrel.test')
    const email = uniqueEmail('racer')
    expect((await owner.post('/api/invites', { email, role: 'driver' })).status).toBe(201)
    const token = lastMailedToken(email)
    const replies = await Promise.all(Array.from({ length: 5 }, (_, i) =>
      new Client().post('/api/invites/accept', { token, name: `Racer ${i}`, password: 'a long enough password' })))
    const statuses = replies.map(r => r.status).sort()
    expect(statuses).toEqual([201, 409, 409, 409, 409])
    expect(count('select count(*) n from users where email = ?', email)).toBe(1)
  })
})

describe('the fitted core', () => {
  it('lets only staff set a car\'s fitted core', async () => {
    const driver = await signIn('driver@kestrel.test')
    const car = row('select * from vehicles where registration = ?', 'KRP·0421')
    const core = (row('select id from cores where kind = \'front-mount\' and workshop_id = ?', car.workshop_id) as { id: number }).id
    const patched = await driver.patch<{ message: string }>(`/api/vehicles/${car.id}`, { fittedCoreId: core })
    expect(patched.status).toBe(403)
    expect(patched.body.message).toMatch(/Only the workshop sets which intercooler core is fitted/)
    expect(row('select * from vehicles where id = ?', car.id)).toEqual(car)
    const created = await driver.post('/api/vehicles', { description: 'Driver car with a core', displacementL: 1.4, cylinders: 4, fuel: 'petrol', fittedCoreId: core })
    expect(created.status).toBe(403)
    // The tuner may.
    const tuner = await signIn('tuner@kestrel.test')
    expect((await tuner.patch(`/api/vehicles/${car.id}`, { fittedCoreId: car.fitted_core_id })).status).toBe(200)
  })
})

describe('the shared report', () => {
  it('answers with what the page shows: no ids, no file details, no staff notes', async () => {
    const tuner = await signIn('tuner@kestrel.test')
    const id = firstLogId()
    const link = await tuner.post<{ url: string }>(`/api/logs/${id}/share`, { expiresInDays: 2 })
    expect(link.status).toBe(201)
    const token = link.body.url.split('/shared/')[1]!
    const reply = await new Client().get<Record<string, unknown>>(`/api/shared/${token}`)
    expect(reply.status).toBe(200)
    const text = JSON.stringify(reply.body)
    for (const key of ['"id"', '"vehicleId"', '"ownerId"', '"workshopId"', '"logId"', '"uploadedById"', '"uploadedByName"', '"originalName"', '"pullEdits"']) {
      expect(text).not.toContain(key)
    }
    const car = row('select v.notes from vehicles v join logs l on l.vehicle_id = v.id where l.id = ?', id) as { notes: string }
    expect(car.notes.length).toBeGreaterThan(0)
    expect(text).not.toContain(car.notes)
    expect(reply.body).toMatchObject({ workshopName: 'Kestrel Road Performance', log: { vehicle: { fuel: 'diesel' } } })
  })
})

describe('password change attempts', () => {
  it('counts wrong current passwords like failed sign-ins', async () => {
    const member = await freshMember(await signIn('owner@kestrel.test'), 'tuner')
    for (let i = 0; i < 5; i++) {
      expect((await member.post('/api/auth/password', { currentPassword: `wrong-${i}`, newPassword: 'new password 456' })).status).toBe(400)
    }
    const slowed = await member.post<{ message: string }>('/api/auth/password', { currentPassword: MEMBER_PASSWORD, newPassword: 'new password 456' })
    expect(slowed.status).toBe(429)
    expect(Number(slowed.headers.get('retry-after'))).toBeGreaterThan(0)
  })
})
