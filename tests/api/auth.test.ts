import { describe, expect, it } from 'vitest'
import { Client, DEMO_PASSWORD, MEMBER_PASSWORD, freshMember, lastMailedToken, readDatabase, signIn, uniqueEmail, useTestServer } from './client'

await useTestServer()

const DEMO_EMAILS = [
  'owner@kestrel.test', 'tuner@kestrel.test', 'fab@kestrel.test', 'driver@kestrel.test', 'driver2@kestrel.test',
  'owner@harbourside.test', 'driver@harbourside.test',
]

describe('sign-in', () => {
  it.each(DEMO_EMAILS)('signs in the demo account %s and reports its role', async (email) => {
    const client = new Client()
    const reply = await client.post<{ user: { email: string, role: string } }>('/api/auth/login', { email, password: DEMO_PASSWORD })
    expect(reply.status).toBe(200)
    expect(reply.body.user.email).toBe(email)
    const me = await client.get<{ user: { role: string } }>('/api/me')
    expect(me.status).toBe(200)
    expect(me.body.user.role).toBe(reply.body.user.role)
  })

  it('answers an unknown address and a wrong password the same way', async () => {
    const unknown = await new Client().post<{ message: string }>('/api/auth/login', { email: uniqueEmail('nobody'), password: 'whatever-it-is' })
    const wrong = await new Client().post<{ message: string }>('/api/auth/login', { email: 'driver2@kestrel.test', password: 'not-the-password' })
    expect(unknown.status).toBe(401)
    expect(wrong.status).toBe(401)
    expect(wrong.body.message).toBe(unknown.body.message)
  })

  it('rejects a malformed body with a message saying what is missing', async () => {
    const reply = await new Client().post<{ message: string }>('/api/auth/login', { email: 'owner@kestrel.test' })
    expect(reply.status).toBe(400)
    expect(reply.body.message).toBe('Please check the form — enter your password. Correct it and try again.')
  })

  it('signs out: the cookie no longer opens the API', async () => {
    const client = await signIn('tuner@kestrel.test')
    expect((await client.get('/api/vehicles')).status).toBe(200)
    expect((await client.post('/api/auth/logout')).status).toBe(200)
    expect((await client.get('/api/vehicles')).status).toBe(401)
  })
})

describe('sign-in limits', () => {
  it('slows one address down after 5 failures from one client, doubling the wait; the right password works after it', async () => {
    const { email } = await freshMember(await signIn('owner@kestrel.test'), 'fabricator')
    const guesser = new Client()
    for (let attempt = 0; attempt < 5; attempt++) {
      expect((await guesser.post('/api/auth/login', { email, password: `wrong-${attempt}` })).status).toBe(401)
    }
    const slowed = await guesser.post<{ message: string }>('/api/auth/login', { email, password: MEMBER_PASSWORD })
    expect(slowed.status).toBe(429)
    expect(slowed.body.message).toMatch(/Wait 1 second before the next try/)
    expect(slowed.headers.get('retry-after')).toBe('1')
    await new Promise(resolve => setTimeout(resolve, 1100))
    expect((await guesser.post('/api/auth/login', { email, password: 'wrong-again' })).status).toBe(401)
    const longer = await guesser.post<{ message: string }>('/api/auth/login', { email, password: MEMBER_PASSWORD })
    expect(longer.status).toBe(429)
    expect(longer.headers.get('retry-after')).toBe('2')
    await new Promise(resolve => setTimeout(resolve, 2100))
    expect((await guesser.post('/api/auth/login', { email, password: MEMBER_PASSWORD })).status).toBe(200)
  })

  it('does not let one client\'s guesses lock the person out elsewhere', async () => {
    const { email } = await freshMember(await signIn('owner@kestrel.test'), 'fabricator')
    const guesser = new Client()
    for (let attempt = 0; attempt < 6; attempt++) await guesser.post('/api/auth/login', { email, password: `wrong-${attempt}` })
    expect((await guesser.post('/api/auth/login', { email, password: MEMBER_PASSWORD })).status).toBe(429)
    expect((await new Client().post('/api/auth/login', { email, password: MEMBER_PASSWORD })).status).toBe(200)
    // Another account is not affected either.
    expect((await guesser.post('/api/auth/login', { email: 'tuner@kestrel.test', password: DEMO_PASSWORD })).status).toBe(200)
  })

  it('slows one address down after 10 failures spread over many clients, for a minute at most', async () => {
    const { email } = await freshMember(await signIn('owner@kestrel.test'), 'fabricator')
    for (let attempt = 0; attempt < 10; attempt++) {
      expect((await new Client().post('/api/auth/login', { email, password: `wrong-${attempt}` })).status).toBe(401)
    }
    const slowed = await new Client().post<{ message: string }>('/api/auth/login', { email, password: MEMBER_PASSWORD })
    expect(slowed.status).toBe(429)
    expect(Number(slowed.headers.get('retry-after'))).toBeLessThanOrEqual(60)
    await new Promise(resolve => setTimeout(resolve, Number(slowed.headers.get('retry-after')) * 1000 + 100))
    expect((await new Client().post('/api/auth/login', { email, password: MEMBER_PASSWORD })).status).toBe(200)
  })

  it('locks one client address after 30 failures across many e-mail addresses', async () => {
    const client = new Client('203.0.113.77')
    for (let attempt = 0; attempt < 30; attempt++) {
      expect((await client.post('/api/auth/login', { email: uniqueEmail('guess'), password: 'guess' })).status).toBe(401)
    }
    const locked = await client.post<{ message: string }>('/api/auth/login', { email: 'driver@kestrel.test', password: DEMO_PASSWORD })
    expect(locked.status).toBe(429)
    expect(locked.body.message).toMatch(/this network/)
    // The same account from another address still works.
    expect((await new Client().post('/api/auth/login', { email: 'driver@kestrel.test', password: DEMO_PASSWORD })).status).toBe(200)
  })
})

describe('password reset by e-mail link', () => {
  it('gives the same answer for a known and an unknown address', async () => {
    const known = await new Client().post<{ message: string }>('/api/auth/reset-request', { email: 'driver@harbourside.test' })
    const unknown = await new Client().post<{ message: string }>('/api/auth/reset-request', { email: uniqueEmail('ghost') })
    expect(known.status).toBe(200)
    expect(unknown.status).toBe(200)
    expect(unknown.body.message).toBe(known.body.message)
  })

  it('sets a new password once per link', async () => {
    const owner = await signIn('owner@kestrel.test')
    const email = uniqueEmail('reset')
    await owner.post('/api/invites', { email, role: 'driver' })
    const joined = await new Client().post('/api/invites/accept', { token: lastMailedToken(email), name: 'Reset Tester', password: 'first password here' })
    expect(joined.status).toBe(201)

    await new Client().post('/api/auth/reset-request', { email })
    const token = lastMailedToken(email)
    const reset = await new Client().post('/api/auth/reset', { token, password: 'second password here' })
    expect(reset.status).toBe(200)
    expect((await new Client().post('/api/auth/login', { email, password: 'first password here' })).status).toBe(401)
    expect((await new Client().post('/api/auth/login', { email, password: 'second password here' })).status).toBe(200)

    const again = await new Client().post<{ message: string }>('/api/auth/reset', { token, password: 'third password here' })
    expect(again.status).toBe(400)
    expect(again.body.message).toMatch(/expired or was already used/)
  })

  it('refuses a short new password and says how long it must be', async () => {
    const reply = await new Client().post<{ message: string }>('/api/auth/reset', { token: 'x'.repeat(40), password: 'short' })
    expect(reply.status).toBe(400)
    expect(reply.body.message).toMatch(/at least 10 characters/)
  })
})

describe('change password', () => {
  it('needs the current password, then takes the new one', async () => {
    const owner = await signIn('owner@kestrel.test')
    const email = uniqueEmail('change')
    await owner.post('/api/invites', { email, role: 'tuner' })
    const client = new Client()
    await client.post('/api/invites/accept', { token: lastMailedToken(email), name: 'Change Tester', password: 'old password 123' })

    const wrong = await client.post<{ message: string }>('/api/auth/password', { currentPassword: 'nope', newPassword: 'new password 456' })
    expect(wrong.status).toBe(400)
    expect(wrong.body.message).toMatch(/current password/)
    expect((await client.post('/api/auth/password', { currentPassword: 'old password 123', newPassword: 'new password 456' })).status).toBe(200)
    expect((await new Client().post('/api/auth/login', { email, password: 'new password 456' })).status).toBe(200)
    expect((await new Client().post('/api/auth/password', { currentPassword: 'a', newPassword: 'new password 456' })).status).toBe(401)
  })
})

describe('invitations', () => {
  it('lets an invited person join with the role the owner chose, once', async () => {
    const owner = await signIn('owner@kestrel.test')
    const email = uniqueEmail('invited')
    const invite = await owner.post<{ link: string, role: string }>('/api/invites', { email, role: 'fabricator' })
    expect(invite.status).toBe(201)
    const token = lastMailedToken(email)
    expect(invite.body.link).toContain(token)

    const lookup = await new Client().get<{ email: string, workshopName: string, role: string }>(`/api/invites/lookup?token=${token}`)
    expect(lookup.body).toEqual({ email, role: 'fabricator', workshopName: 'Kestrel Road Performance' })

    const person = new Client()
    const joined = await person.post<{ user: { role: string, workshopId: number } }>('/api/invites/accept', { token, name: 'New Fabricator', password: 'a long enough password' })
    expect(joined.status).toBe(201)
    expect(joined.body.user.role).toBe('fabricator')
    expect((await person.get('/api/cores')).status).toBe(200)

    const reuse = await new Client().post('/api/invites/accept', { token, name: 'Someone Else', password: 'a long enough password' })
    expect(reuse.status).toBe(404)
  })

  it('refuses to invite one of the owner\'s own people again', async () => {
    const owner = await signIn('owner@kestrel.test')
    const reply = await owner.post<{ message: string }>('/api/invites', { email: 'driver2@kestrel.test', role: 'driver' })
    expect(reply.status).toBe(409)
    expect(reply.body.message).toMatch(/already belongs to one of your people/)
  })

  it('answers an address of another workshop exactly like a new one, and tells only its holder', async () => {
    const owner = await signIn('owner@kestrel.test')
    const fresh = await owner.post<Record<string, unknown>>('/api/invites', { email: uniqueEmail('new'), role: 'driver' })
    const taken = await owner.post<Record<string, unknown>>('/api/invites', { email: 'driver@harbourside.test', role: 'driver' })
    expect(taken.status).toBe(fresh.status)
    expect(Object.keys(taken.body).sort()).toEqual(Object.keys(fresh.body).sort())
    const mail = readDatabase(db => db.prepare('select text from outbox where to_email = ? order by id desc limit 1').get('driver@harbourside.test') as { text: string })
    expect(mail.text).toMatch(/already has a Densitas account with another workshop/)
    // The link cannot make a second account for the address.
    const token = /token=([\w-]+)/.exec(String(taken.body.link))![1]!
    const second = await new Client().post<{ message: string }>('/api/invites/accept', { token, name: 'Someone', password: 'a long enough password' })
    expect(second.status).toBe(409)
    expect(second.body.message).toBe('That e-mail address already has an account. Sign in instead.')
  })

  it('writes nothing for an invalid invitation', async () => {
    const owner = await signIn('owner@kestrel.test')
    const before = readDatabase(db => (db.prepare('select count(*) n from invites').get() as { n: number }).n)
    const reply = await owner.post<{ message: string }>('/api/invites', { email: 'not-an-address', role: 'boss' })
    expect(reply.status).toBe(400)
    expect(reply.body.message).toBe('Please check the form — enter an e-mail address like name@example.com; choose a role: workshop owner, tuner, fabricator, customer (driver). Correct it and try again.')
    expect(readDatabase(db => (db.prepare('select count(*) n from invites').get() as { n: number }).n)).toBe(before)
  })
})
