import { beforeAll, describe, expect, it } from 'vitest'
import { Client, MEMBER_PASSWORD, freshMember, readDatabase, signIn, useTestServer } from './client'

await useTestServer()

// Every role × every route of the foundation: allowed, 401 (no session), 403 (a row the role can
// see but not change), 404 (another workshop's or another driver's row).

type Who = 'anonymous' | 'owner' | 'tuner' | 'fabricator' | 'driver' | 'driver2' | 'foreignOwner' | 'foreignDriver'
const EMAILS: Record<Exclude<Who, 'anonymous'>, string> = {
  owner: 'owner@kestrel.test',
  tuner: 'tuner@kestrel.test',
  fabricator: 'fab@kestrel.test',
  driver: 'driver@kestrel.test',
  driver2: 'driver2@kestrel.test',
  foreignOwner: 'owner@harbourside.test',
  foreignDriver: 'driver@harbourside.test',
}
const WHO = Object.keys(EMAILS) as Array<Exclude<Who, 'anonymous'>>

const clients = {} as Record<Who, Client>
const ids = { driverCar: 0, driver2Car: 0, foreignCar: 0, driver: 0, driver2: 0, foreignDriver: 0, stockCore: 0 }

function idOf(sql: string, ...args: unknown[]) {
  return readDatabase(db => (db.prepare(sql).get(...args) as { id: number }).id)
}

beforeAll(async () => {
  clients.anonymous = new Client()
  for (const who of WHO) clients[who] = await signIn(EMAILS[who])
  ids.driver = idOf('select id from users where email = ?', EMAILS.driver)
  ids.driver2 = idOf('select id from users where email = ?', EMAILS.driver2)
  ids.foreignDriver = idOf('select id from users where email = ?', EMAILS.foreignDriver)
  ids.driverCar = idOf('select id from vehicles where owner_id = ?', ids.driver)
  ids.driver2Car = idOf('select id from vehicles where owner_id = ?', ids.driver2)
  ids.foreignCar = idOf('select id from vehicles where owner_id = ?', ids.foreignDriver)
  ids.stockCore = idOf('select id from cores where kind = \'stock\'')
})

const newCar = (ownerId?: number) => ({
  description: '1.6 L four-cylinder turbo-petrol coupé',
  displacementL: 1.6,
  cylinders: 4,
  fuel: 'petrol',
  ratedPowerKw: 150,
  ...(ownerId ? { ownerId } : {}),
})

describe('GET /api/vehicles', () => {
  it('needs a session', async () => {
    expect((await clients.anonymous.get('/api/vehicles')).status).toBe(401)
  })

  it.each([
    ['owner', ['driverCar', 'driver2Car']],
    ['tuner', ['driverCar', 'driver2Car']],
    ['fabricator', ['driverCar', 'driver2Car']],
    ['driver', ['driverCar']],
    ['driver2', ['driver2Car']],
    ['foreignOwner', ['foreignCar']],
    ['foreignDriver', ['foreignCar']],
  ] as const)('shows %s only the cars it may see', async (who, expected) => {
    const reply = await clients[who].get<Array<{ id: number }>>('/api/vehicles')
    expect(reply.status).toBe(200)
    const seen = reply.body.map(v => v.id)
    for (const key of expected) expect(seen).toContain(ids[key])
    for (const key of ['driverCar', 'driver2Car', 'foreignCar'] as const) {
      if (!(expected as readonly string[]).includes(key)) expect(seen).not.toContain(ids[key])
    }
  })
})

describe('GET /api/vehicles/:id', () => {
  it.each([
    ['anonymous', 401], ['owner', 200], ['tuner', 200], ['fabricator', 200],
    ['driver', 200], ['driver2', 404], ['foreignOwner', 404], ['foreignDriver', 404],
  ] as const)('%s → %i for the driver\'s car', async (who, status) => {
    expect((await clients[who].get(`/api/vehicles/${ids.driverCar}`)).status).toBe(status)
  })

  it('treats a malformed id as a bad request with a message', async () => {
    const reply = await clients.owner.get<{ message: string }>('/api/vehicles/not-a-number')
    expect(reply.status).toBe(400)
    expect(reply.body.message).toBe('Please check the link — the link should end in a whole number. Open the page again from the menu.')
  })
})

describe('PATCH /api/vehicles/:id', () => {
  it.each([
    ['anonymous', 401], ['owner', 200], ['tuner', 200], ['fabricator', 403],
    ['driver', 200], ['driver2', 404], ['foreignOwner', 404], ['foreignDriver', 404],
  ] as const)('%s → %i changing the driver\'s car', async (who, status) => {
    const reply = await clients[who].patch<{ notes?: string }>(`/api/vehicles/${ids.driverCar}`, { notes: `checked by ${who}` })
    expect(reply.status).toBe(status)
    if (status === 200) expect(reply.body.notes).toBe(`checked by ${who}`)
  })

  it.each([
    ['anonymous', 401], ['owner', 200], ['tuner', 200], ['fabricator', 403],
    ['driver', 403], ['driver2', 404], ['foreignOwner', 404], ['foreignDriver', 404],
  ] as const)('%s → %i setting the fitted core of the driver\'s car (staff only)', async (who, status) => {
    expect((await clients[who].patch(`/api/vehicles/${ids.driverCar}`, { fittedCoreId: ids.stockCore })).status).toBe(status)
  })

  it('lets only staff move a car to another customer', async () => {
    const refused = await clients.driver.patch<{ message: string }>(`/api/vehicles/${ids.driverCar}`, { ownerId: ids.driver2 })
    expect(refused.status).toBe(403)
    expect(refused.body.message).toBe('Only the workshop can move a car to another customer.')
    expect((await clients.tuner.patch(`/api/vehicles/${ids.driverCar}`, { ownerId: ids.driver2 })).status).toBe(200)
    expect((await clients.tuner.patch(`/api/vehicles/${ids.driverCar}`, { ownerId: ids.driver })).status).toBe(200)
  })

  it('refuses a customer or a core of another workshop, without saying whether it exists', async () => {
    const toForeignDriver = await clients.owner.patch<{ message: string }>(`/api/vehicles/${ids.driverCar}`, { ownerId: ids.foreignDriver })
    expect(toForeignDriver.status).toBe(400)
    expect(toForeignDriver.body.message).toBe('Customer: that customer is not in your workshop. Pick the customer from the list, or invite them first.')
    const foreignCore = await clients.foreignOwner.patch<{ message: string }>(`/api/vehicles/${ids.foreignCar}`, { fittedCoreId: ids.stockCore })
    expect(foreignCore.status).toBe(400)
    expect(foreignCore.body.message).toBe('Fitted core: that core is not in your catalogue. Pick one from the core catalogue or leave it empty.')
  })

  it('rejects bad values with a message and leaves the car as it was', async () => {
    const before = readDatabase(db => db.prepare('select * from vehicles where id = ?').get(ids.driverCar))
    const reply = await clients.tuner.patch<{ message: string }>(`/api/vehicles/${ids.driverCar}`, { displacementL: 2000, cylinders: 4.5 })
    expect(reply.status).toBe(400)
    expect(reply.body.message).toBe('Please check the form — engine size is in litres: at most 10; cylinders is a whole number. Correct it and try again.')
    expect(reply.body.message).not.toMatch(/displacementL|[a-z][A-Z]/)
    expect(readDatabase(db => db.prepare('select * from vehicles where id = ?').get(ids.driverCar))).toEqual(before)
  })
})

describe('POST /api/vehicles', () => {
  it('needs a session', async () => {
    expect((await clients.anonymous.post('/api/vehicles', newCar())).status).toBe(401)
  })

  it.each(['owner', 'tuner'] as const)('lets the %s add a car for a customer', async (who) => {
    const reply = await clients[who].post<{ id: number, ownerId: number }>('/api/vehicles', newCar(ids.driver2))
    expect(reply.status).toBe(201)
    expect(reply.body.ownerId).toBe(ids.driver2)
  })

  it('refuses the fabricator (reads cars, does not add them)', async () => {
    expect((await clients.fabricator.post('/api/vehicles', newCar(ids.driver2))).status).toBe(403)
  })

  it('lets a driver add a car to their own account only', async () => {
    const own = await clients.driver.post<{ ownerId: number }>('/api/vehicles', newCar())
    expect(own.status).toBe(201)
    expect(own.body.ownerId).toBe(ids.driver)
    expect((await clients.driver.post('/api/vehicles', newCar(ids.driver2))).status).toBe(403)
  })

  it('refuses a car for another workshop\'s customer', async () => {
    const reply = await clients.foreignOwner.post<{ message: string }>('/api/vehicles', newCar(ids.driver))
    expect(reply.status).toBe(400)
    expect(reply.body.message).toBe('Customer: that customer is not in your workshop. Pick the customer from the list, or invite them first.')
  })

  it('writes nothing when the body is wrong, and says what to fix', async () => {
    const count = () => readDatabase(db => (db.prepare('select count(*) n from vehicles').get() as { n: number }).n)
    const before = count()
    const reply = await clients.tuner.post<{ message: string }>('/api/vehicles', { description: 'x', fuel: 'steam', ownerId: ids.driver })
    expect(reply.status).toBe(400)
    expect(reply.body.message).toBe('Please check the form — Description: describe the car in a few words, e.g. "2.0 L four-cylinder turbo-diesel hatchback"; enter the engine size in litres; Cylinders: this is missing; fuel is diesel or petrol. Correct it and try again.')
    expect(count()).toBe(before)
  })

  it('answers a body that is not JSON with a 400, not a crash', async () => {
    const client = clients.tuner
    const response = await fetch(`${(await import('@nuxt/test-utils/e2e')).url('/api/vehicles')}`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'cookie': client.cookie },
      body: '{"description": ',
    })
    expect(response.status).toBe(400)
    expect(((await response.json()) as { message: string }).message).toBe('The form did not arrive in a shape the server can read. Reload the page and try again.')
  })
})

describe('DELETE /api/vehicles/:id', () => {
  it.each([
    ['anonymous', 401], ['owner', 204], ['tuner', 204], ['fabricator', 403],
    ['driver', 403], ['driver2', 404], ['foreignOwner', 404], ['foreignDriver', 404],
  ] as const)('%s → %i deleting a car of the driver', async (who, status) => {
    const created = await clients.tuner.post<{ id: number }>('/api/vehicles', newCar(ids.driver))
    expect(created.status).toBe(201)
    expect((await clients[who].delete(`/api/vehicles/${created.body.id}`)).status).toBe(status)
    const left = readDatabase(db => db.prepare('select id from vehicles where id = ?').get(created.body.id))
    expect(Boolean(left)).toBe(status !== 204)
  })
})

describe('members', () => {
  it.each([
    ['anonymous', 401], ['owner', 200], ['tuner', 200], ['fabricator', 200], ['driver', 403], ['foreignOwner', 200],
  ] as const)('GET /api/members: %s → %i', async (who, status) => {
    const reply = await clients[who].get<Array<{ email: string, role: string }>>('/api/members')
    expect(reply.status).toBe(status)
    if (status !== 200) return
    const emails = reply.body.map(m => m.email)
    if (who === 'foreignOwner') {
      expect(emails).toContain(EMAILS.foreignDriver)
      expect(emails).not.toContain(EMAILS.driver)
    }
    else if (who === 'owner') {
      expect(emails).toEqual(expect.arrayContaining([EMAILS.tuner, EMAILS.driver]))
    }
    else {
      // Staff other than the owner see the customers only.
      expect(reply.body.every(m => m.role === 'driver')).toBe(true)
    }
  })

  it.each([
    ['anonymous', 401], ['tuner', 403], ['fabricator', 403], ['driver', 403], ['foreignOwner', 404],
  ] as const)('PATCH and DELETE /api/members/:id: %s → %i', async (who, status) => {
    expect((await clients[who].patch(`/api/members/${ids.driver2}`, { role: 'tuner' })).status).toBe(status)
    expect((await clients[who].delete(`/api/members/${ids.driver2}`)).status).toBe(status)
  })

  it('lets the owner change a role, and the change holds on the very next request', async () => {
    const member = await freshMember(clients.owner, 'tuner')
    expect((await member.get('/api/members')).status).toBe(200)
    expect((await member.post('/api/vehicles', newCar(ids.driver))).status).toBe(201)

    expect((await clients.owner.patch(`/api/members/${member.id}`, { role: 'driver' })).status).toBe(200)
    expect((await member.get('/api/members')).status).toBe(403)
    const list = await member.get<unknown[]>('/api/vehicles')
    expect(list.body).toEqual([])
    expect((await member.get(`/api/vehicles/${ids.driverCar}`)).status).toBe(404)

    expect((await clients.owner.patch(`/api/members/${member.id}`, { role: 'fabricator' })).status).toBe(200)
    expect((await member.post('/api/vehicles', newCar(ids.driver))).status).toBe(403)
    expect((await member.get('/api/cores')).status).toBe(200)
  })

  it('keeps at least one owner', async () => {
    const ownerId = idOf('select id from users where email = ?', EMAILS.owner)
    const reply = await clients.owner.patch<{ message: string }>(`/api/members/${ownerId}`, { role: 'tuner' })
    expect(reply.status).toBe(400)
    expect(reply.body.message).toMatch(/at least one owner/)
  })

  it('lets the owner remove a member, who is signed out at once', async () => {
    const member = await freshMember(clients.owner, 'fabricator')
    expect((await clients.owner.delete(`/api/members/${member.id}`)).status).toBe(204)
    expect((await member.get('/api/cores')).status).toBe(401)
  })

  it('refuses to remove a customer who still owns cars', async () => {
    const reply = await clients.owner.delete<{ message: string }>(`/api/members/${ids.driver}`)
    expect(reply.status).toBe(400)
    expect(reply.body.message).toMatch(/still has \d+ cars?\. Open each one under Cars and choose another customer/)
  })
})

describe('invites', () => {
  it.each([
    ['anonymous', 401], ['tuner', 403], ['fabricator', 403], ['driver', 403],
  ] as const)('%s → %i for every invitation route', async (who, status) => {
    expect((await clients[who].get('/api/invites')).status).toBe(status)
    expect((await clients[who].post('/api/invites', { email: 'x@example.test', role: 'driver' })).status).toBe(status)
    expect((await clients[who].delete('/api/invites/1')).status).toBe(status)
  })

  it('keeps each workshop\'s invitations to itself', async () => {
    const created = await clients.owner.post<{ id: number }>('/api/invites', { email: `iso-${Date.now()}@example.test`, role: 'driver' })
    expect(created.status).toBe(201)
    const foreignList = await clients.foreignOwner.get<Array<{ id: number }>>('/api/invites')
    expect(foreignList.body.map(i => i.id)).not.toContain(created.body.id)
    expect((await clients.foreignOwner.delete(`/api/invites/${created.body.id}`)).status).toBe(404)
    expect((await clients.owner.delete(`/api/invites/${created.body.id}`)).status).toBe(204)
  })
})

describe('workshop prices and overview', () => {
  it.each([
    ['anonymous', 401], ['owner', 200], ['tuner', 403], ['fabricator', 403], ['driver', 403],
  ] as const)('PATCH /api/workshop: %s → %i', async (who, status) => {
    expect((await clients[who].patch('/api/workshop', { labourRateCents: 8500 })).status).toBe(status)
  })

  it('scopes the overview counts to what each role may see', async () => {
    const owner = await clients.owner.get<{ vehicles: number, staff: number | null }>('/api/overview')
    const driver = await clients.driver.get<{ vehicles: number, staff: number | null, customers: number | null }>('/api/overview')
    expect(owner.body.staff).toBeGreaterThan(0)
    expect(driver.body.staff).toBeNull()
    expect(driver.body.customers).toBeNull()
    expect(driver.body.vehicles).toBeLessThan(owner.body.vehicles)
  })
})

describe('my account and the workshop record', () => {
  it.each([
    ['anonymous', 401], ['owner', 200], ['tuner', 200], ['fabricator', 200], ['driver', 200],
  ] as const)('GET /api/workshop and /api/overview: %s → %i', async (who, status) => {
    expect((await clients[who].get('/api/workshop')).status).toBe(status)
    expect((await clients[who].get('/api/overview')).status).toBe(status)
  })

  it.each([
    ['anonymous', 401], ['owner', 200], ['tuner', 200], ['fabricator', 200], ['driver', 403],
  ] as const)('GET /api/cores: %s → %i', async (who, status) => {
    expect((await clients[who].get('/api/cores')).status).toBe(status)
  })

  it('keeps each person\'s display units, and refuses units it does not know', async () => {
    const saved = await clients.driver2.patch<{ user: { preferences: Record<string, string> } }>('/api/me', { preferences: { temperature: 'F', power: 'PS' } })
    expect(saved.status).toBe(200)
    expect((await clients.driver2.get<{ user: { preferences: Record<string, string> } }>('/api/me')).body.user.preferences).toMatchObject({ temperature: 'F', power: 'PS' })
    // The choices are the unit catalogue's (shared/quantities/display.ts): kelvin, atmospheres and
    // brake horsepower are not among them, and a refused change leaves every saved unit as it was.
    const wrong = await clients.driver2.patch<{ message: string }>('/api/me', { preferences: { temperature: 'K', pressure: 'psi' } })
    expect(wrong.status).toBe(400)
    expect(wrong.body.message).toBe('Please check the form — the temperature unit must be C (°C) or F (°F). Correct it and try again.')
    const pressure = await clients.driver2.patch<{ message: string }>('/api/me', { preferences: { pressure: 'atm' } })
    expect(pressure.status).toBe(400)
    expect(pressure.body.message).toBe('Please check the form — the pressure unit must be kPa, bar or psi. Correct it and try again.')
    const power = await clients.driver2.patch<{ message: string }>('/api/me', { preferences: { power: 'bhp' } })
    expect(power.status).toBe(400)
    expect(power.body.message).toBe('Please check the form — the power unit must be kW, hp or PS. Correct it and try again.')
    expect((await clients.driver2.get<{ user: { preferences: Record<string, string> } }>('/api/me')).body.user.preferences).toMatchObject({ temperature: 'F', power: 'PS' })
    expect((await clients.driver2.get<{ user: { preferences: Record<string, string> } }>('/api/me')).body.user.preferences.pressure).not.toBe('psi')
    expect((await clients.anonymous.patch('/api/me', { name: 'x' })).status).toBe(401)
    await clients.driver2.patch('/api/me', { preferences: { temperature: 'C', power: 'kW' } })
  })
})

describe('signing out', () => {
  it.each(['owner', 'tuner', 'fabricator', 'driver'] as const)('POST /api/auth/logout everywhere: a %s ends their own sign-ins only', async (role) => {
    const member = await freshMember(clients.owner, role)
    const second = await signIn(member.email, MEMBER_PASSWORD)
    expect((await member.post('/api/auth/logout', { everywhere: true })).status).toBe(200)
    expect((await second.get('/api/me')).status).toBe(401)
    expect((await clients[role].get('/api/me')).status).toBe(200)
  })

  it('answers a sign-out without a sign-in with 200 (nothing to end), and a bad body with 400', async () => {
    expect((await new Client().post('/api/auth/logout', { everywhere: true })).status).toBe(200)
    const member = await freshMember(clients.owner, 'driver')
    const bad = await member.post<{ message: string }>('/api/auth/logout', { everywhere: 'yes' })
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/everywhere is true or false/)
    expect((await member.get('/api/me')).status).toBe(200)
  })
})
