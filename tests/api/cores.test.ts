import { beforeAll, describe, expect, it } from 'vitest'
import { Client, readDatabase, signIn, useTestServer } from './client'

await useTestServer()

// The core catalogue: role × route, search/sort/pages, bad input that stores nothing, PATCH that
// writes only what it was sent, retire and restore.

type Who = 'anonymous' | 'owner' | 'tuner' | 'fabricator' | 'driver' | 'foreignOwner'
const EMAILS: Record<Exclude<Who, 'anonymous'>, string> = {
  owner: 'owner@kestrel.test',
  tuner: 'tuner@kestrel.test',
  fabricator: 'fab@kestrel.test',
  driver: 'driver@kestrel.test',
  foreignOwner: 'owner@harbourside.test',
}
const clients = {} as Record<Who, Client>
let kestrelCore = 0
let foreignCore = 0
let counter = 0

interface CoreReply { id: number, name: string, depthMm: number, notes: string, priceCents: number | null, retired: boolean, [key: string]: unknown }
interface PageReply { items: CoreReply[], total: number, page: number, pageSize: number }

const coreCount = () => readDatabase(db => (db.prepare('select count(*) n from cores').get() as { n: number }).n)
const rowOf = (id: number) => readDatabase(db => db.prepare('select * from cores where id = ?').get(id) as Record<string, unknown>)

const newCore = (over: Record<string, unknown> = {}) => ({
  name: `Test core ${Date.now()}-${++counter}`,
  kind: 'front-mount',
  construction: 'bar-and-plate',
  faceWidthMm: 620,
  faceHeightMm: 280,
  depthMm: 70,
  finDensity: 16,
  finDensityUnit: 'per-inch',
  inletDiameterMm: 63,
  outletDiameterMm: 63,
  endTankLayout: 'opposite-sides',
  weightKg: 6.5,
  uaWPerK: 400,
  costCents: 30_000,
  priceCents: 52_050,
  notes: 'made for the tests',
  ...over,
})

beforeAll(async () => {
  clients.anonymous = new Client()
  for (const who of Object.keys(EMAILS) as Array<Exclude<Who, 'anonymous'>>) clients[who] = await signIn(EMAILS[who])
  kestrelCore = readDatabase(db => (db.prepare('select id from cores where name = ?').get('Compact front-mount 550') as { id: number }).id)
  foreignCore = readDatabase(db => (db.prepare('select id from cores where name = ?').get('Harbourside tube-and-fin front-mount 700') as { id: number }).id)
})

describe('the demo catalogue', () => {
  it('holds at least four Kestrel cores with every field filled', async () => {
    const reply = await clients.fabricator.get<CoreReply[]>('/api/cores')
    expect(reply.status).toBe(200)
    const full = reply.body.filter(core => ['construction', 'finDensity', 'finDensityUnit', 'inletDiameterMm', 'outletDiameterMm', 'endTankLayout', 'weightKg', 'uaWPerK', 'costCents', 'priceCents']
      .every(key => core[key] != null))
    expect(full.length).toBeGreaterThanOrEqual(4)
    expect(reply.body.map(c => c.name)).toEqual(expect.arrayContaining(['Factory side-mount core (small)', 'Kestrel bar-and-plate front-mount 600', 'Compact front-mount 550']))
  })
})

describe('role × route', () => {
  it.each([
    ['anonymous', 401], ['owner', 200], ['tuner', 200], ['fabricator', 200], ['driver', 403], ['foreignOwner', 404],
  ] as const)('GET /api/cores/:id: %s → %i', async (who, status) => {
    expect((await clients[who].get(`/api/cores/${kestrelCore}`)).status).toBe(status)
  })

  it.each([
    ['anonymous', 401], ['owner', 201], ['tuner', 403], ['fabricator', 201], ['driver', 403],
  ] as const)('POST /api/cores: %s → %i', async (who, status) => {
    const before = coreCount()
    const reply = await clients[who].post('/api/cores', newCore())
    expect(reply.status).toBe(status)
    expect(coreCount()).toBe(before + (status === 201 ? 1 : 0))
  })

  it.each([
    ['anonymous', 401], ['owner', 200], ['tuner', 403], ['fabricator', 200], ['driver', 403], ['foreignOwner', 404],
  ] as const)('PATCH /api/cores/:id: %s → %i', async (who, status) => {
    const notes = `patched by ${who}`
    const reply = await clients[who].patch(`/api/cores/${kestrelCore}`, { notes })
    expect(reply.status).toBe(status)
    expect(rowOf(kestrelCore).notes === notes).toBe(status === 200)
  })

  it.each([
    ['anonymous', 401], ['tuner', 403], ['driver', 403], ['foreignOwner', 404], ['fabricator', 200],
  ] as const)('DELETE (retire) and POST restore: %s → %i', async (who, status) => {
    const created = await clients.owner.post<CoreReply>('/api/cores', newCore())
    const retire = await clients[who].delete<CoreReply>(`/api/cores/${created.body.id}`)
    expect(retire.status).toBe(status)
    expect(rowOf(created.body.id).retired_at !== null).toBe(status === 200)
    if (status !== 200) return
    // The row stays; it leaves the picker list but is kept for old logs.
    expect((await clients.owner.get<CoreReply[]>('/api/cores')).body.map(c => c.id)).not.toContain(created.body.id)
    expect((await clients.owner.get<CoreReply>(`/api/cores/${created.body.id}`)).body.retired).toBe(true)
    const restore = await clients[who].post<CoreReply>(`/api/cores/${created.body.id}/restore`)
    expect(restore.status).toBe(200)
    expect(restore.body.retired).toBe(false)
  })

  it('refuses to restore for the tuner and hides another workshop\'s core', async () => {
    expect((await clients.tuner.post(`/api/cores/${kestrelCore}/restore`)).status).toBe(403)
    expect((await clients.owner.post(`/api/cores/${foreignCore}/restore`)).status).toBe(404)
    expect((await clients.owner.get(`/api/cores/${foreignCore}`)).status).toBe(404)
  })
})

describe('GET /api/cores: search, sort, pages', () => {
  it('keeps the whole list as an array for pickers, without another workshop\'s cores', async () => {
    const reply = await clients.owner.get<CoreReply[]>('/api/cores')
    expect(Array.isArray(reply.body)).toBe(true)
    expect(reply.body.map(c => c.id)).not.toContain(foreignCore)
  })

  it('pages, sorts by a fixed key, and searches names and notes', async () => {
    const page1 = await clients.fabricator.get<PageReply>('/api/cores?page=1&pageSize=10&sort=faceArea&dir=desc')
    expect(page1.status).toBe(200)
    expect(page1.body.pageSize).toBe(10)
    expect(page1.body.items.length).toBeLessThanOrEqual(10)
    const areas = page1.body.items.map(c => (c.faceWidthMm as number) * (c.faceHeightMm as number))
    expect(areas).toEqual([...areas].sort((a, b) => b - a))
    const byName = await clients.fabricator.get<PageReply>('/api/cores?page=1&q=compact')
    expect(byName.body.items.map(c => c.name)).toEqual(['Compact front-mount 550'])
    expect(byName.body.total).toBe(1)
    const byNotes = await clients.fabricator.get<PageReply>(`/api/cores?page=1&q=${encodeURIComponent('usual uprate')}`)
    expect(byNotes.body.items.map(c => c.name)).toEqual(['Kestrel bar-and-plate front-mount 600'])
    const literal = await clients.fabricator.get<PageReply>('/api/cores?page=1&q=%25')
    expect(literal.body.total).toBe(0)
  })

  it.each([
    ['sort=face_width_mm', /sort by one of/],
    ['page=0', /pages start at 1/],
    ['page=1&pageSize=7', /a page holds/],
    ['status=gone', /active, retired or all/],
  ])('refuses ?%s with a message', async (query, message) => {
    const reply = await clients.owner.get<{ message: string }>(`/api/cores?${query}`)
    expect(reply.status).toBe(400)
    expect(reply.body.message).toMatch(message)
  })
})

describe('bad input stores nothing', () => {
  it.each([
    ['a negative depth', { depthMm: -5 }, /Depth: core depth must be between 20 and 150 mm/],
    ['an absurd face width', { faceWidthMm: 6000 }, /Face width: face width must be between 100 and 1200 mm/],
    ['a fractional millimetre', { faceHeightMm: 280.5 }, /whole number/],
    ['a price with a fraction of a cent', { priceCents: 52050.5 }, /Sell price: the sell price cannot have a fraction of a cent/],
    ['a negative cost', { costCents: -1 }, /Cost: the cost cannot be negative/],
    ['a fin density out of range for its unit', { finDensity: 8, finDensityUnit: 'per-10cm' }, /Fin density: must be between 16 and 160 fins per 10 cm/],
    ['a fin density with no unit', { finDensity: 16, finDensityUnit: null }, /per inch or per 10 cm/],
    ['an unknown kind', { kind: 'water-cooled' }, /Kind: the kind is one of/],
    ['an unknown field', { colour: 'black' }, /unknown field/],
    ['no name', { name: ' ' }, /Name: give the core a name/],
  ])('refuses %s', async (_what, over, message) => {
    const before = coreCount()
    const reply = await clients.fabricator.post<{ message: string }>('/api/cores', newCore(over))
    expect(reply.status).toBe(400)
    expect(reply.body.message).toMatch(message)
    expect(reply.body.message).not.toMatch(/priceCents|depthMm|faceWidthMm/)
    expect(coreCount()).toBe(before)
  })

  it('refuses a name the workshop already uses with 409, on add and on rename', async () => {
    const before = coreCount()
    const reply = await clients.fabricator.post<{ message: string }>('/api/cores', newCore({ name: 'Compact front-mount 550' }))
    expect(reply.status).toBe(409)
    expect(reply.body.message).toMatch(/already has a core called "Compact front-mount 550"/)
    expect(coreCount()).toBe(before)
    const created = await clients.fabricator.post<CoreReply>('/api/cores', newCore())
    const rename = await clients.fabricator.patch<{ message: string }>(`/api/cores/${created.body.id}`, { name: 'Compact front-mount 550' })
    expect(rename.status).toBe(409)
    expect(rowOf(created.body.id).name).toBe(created.body.name)
  })

  it('lets another workshop use the same name', async () => {
    const reply = await clients.foreignOwner.post('/api/cores', newCore({ name: 'Compact front-mount 550' }))
    expect(reply.status).toBe(201)
  })

  it('refuses a bad PATCH and leaves the row as it was', async () => {
    const before = rowOf(kestrelCore)
    for (const body of [{ depthMm: 0 }, { priceCents: 1.5 }, {}, { finDensity: 200 }]) {
      const reply = await clients.owner.patch<{ message: string }>(`/api/cores/${kestrelCore}`, body)
      expect(reply.status).toBe(400)
      expect(reply.body.message.length).toBeGreaterThan(10)
    }
    expect(rowOf(kestrelCore)).toEqual(before)
  })
})

describe('PATCH writes only the keys sent', () => {
  it('changes one field and leaves every other field of the row intact', async () => {
    const created = await clients.fabricator.post<CoreReply>('/api/cores', newCore())
    const before = rowOf(created.body.id)
    const reply = await clients.fabricator.patch<CoreReply>(`/api/cores/${created.body.id}`, { depthMm: 90 })
    expect(reply.status).toBe(200)
    const after = rowOf(created.body.id)
    expect(after.depth_mm).toBe(90)
    const { depth_mm: _d1, updated_at: _u1, ...restBefore } = before
    const { depth_mm: _d2, updated_at: _u2, ...restAfter } = after
    expect(restAfter).toEqual(restBefore)
  })

  it('lets an unknown value be cleared with null', async () => {
    const created = await clients.fabricator.post<CoreReply>('/api/cores', newCore())
    const reply = await clients.fabricator.patch<CoreReply>(`/api/cores/${created.body.id}`, { weightKg: null })
    expect(reply.status).toBe(200)
    expect(rowOf(created.body.id).weight_kg).toBeNull()
    expect(rowOf(created.body.id).price_cents).toBe(52_050)
  })
})

describe('a retired core is not offered for fitting', () => {
  it('refuses it as a car\'s new fitted core, with a message', async () => {
    const created = await clients.owner.post<CoreReply>('/api/cores', newCore())
    await clients.owner.delete(`/api/cores/${created.body.id}`)
    const car = readDatabase(db => (db.prepare('select v.id from vehicles v join users u on u.id = v.owner_id where u.email = ?').get('driver2@kestrel.test') as { id: number }).id)
    const before = readDatabase(db => (db.prepare('select fitted_core_id f from vehicles where id = ?').get(car) as { f: number | null }).f)
    const reply = await clients.owner.patch<{ message: string }>(`/api/vehicles/${car}`, { fittedCoreId: created.body.id })
    expect(reply.status).toBe(400)
    expect(reply.body.message).toBe('Fitted core: that core is retired from the catalogue. Pick a current core, or bring it back in the catalogue first.')
    expect(readDatabase(db => (db.prepare('select fitted_core_id f from vehicles where id = ?').get(car) as { f: number | null }).f)).toBe(before)
  })
})
