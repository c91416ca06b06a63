import { beforeAll, describe, expect, it } from 'vitest'
import { Client, readDatabase, signIn, useTestServer } from './client'

await useTestServer()

type Who = 'anonymous' | 'owner' | 'tuner' | 'fabricator' | 'driver' | 'driver2' | 'foreignOwner'
const clients = {} as Record<Who, Client>
const ids = { driverCar: 0, driver2Car: 0, foreignCar: 0, foreignCore: 0 }

interface Correction { standard: string, name: string, factor: number | null, correctedPowerKw: number | null, valid: boolean, notes: string[] }
interface Run { id: number, label: string, side: string | null, powerKw: number, corrections: Correction[] }
interface Compared { standard: string, caution: string, comparison: null | { standard: string, before: { n: number, meanKw: number }, after: { n: number, meanKw: number }, changeKw: number, changePct: number, verdict: string, dynoSpreadNote: string } }

const one = <T>(sql: string, ...args: unknown[]) => readDatabase(db => db.prepare(sql).get(...args) as T)
const runCount = () => one<{ n: number }>('select count(*) n from dyno_runs').n
let toDelete = 0
const run = (extra: Record<string, unknown> = {}) => ({ label: 'Test run', side: 'after', powerKw: 100, ambientTempC: 25, baroKpa: 99, ...extra })

beforeAll(async () => {
  clients.anonymous = new Client()
  clients.owner = await signIn('owner@kestrel.test')
  clients.tuner = await signIn('tuner@kestrel.test')
  clients.fabricator = await signIn('fab@kestrel.test')
  clients.driver = await signIn('driver@kestrel.test')
  clients.driver2 = await signIn('driver2@kestrel.test')
  clients.foreignOwner = await signIn('owner@harbourside.test')
  const carOf = (email: string) => one<{ id: number }>('select v.id from vehicles v join users u on u.id = v.owner_id where u.email = ? order by v.id limit 1', email).id
  ids.driverCar = carOf('driver@kestrel.test')
  ids.driver2Car = carOf('driver2@kestrel.test')
  ids.foreignCar = carOf('driver@harbourside.test')
  ids.foreignCore = one<{ id: number }>('select id from cores where name like ?', 'Harbourside%').id
  toDelete = (await clients.tuner.post<Run>(`/api/vehicles/${ids.driverCar}/dyno-runs`, run({ label: 'to delete' }))).body.id
})

describe('the demo pair of dyno runs', () => {
  it('each run carries the four corrections, ISO 1585 as compression ignition for the diesel', async () => {
    const reply = await clients.driver.get<Run[]>(`/api/vehicles/${ids.driverCar}/dyno-runs`)
    expect(reply.status).toBe(200)
    const [before, after] = reply.body.filter(r => r.label.startsWith('Before:') || r.label.startsWith('After:'))
    expect(before!.side).toBe('before')
    expect(after!.corrections.map(c => c.standard)).toEqual(['sae-j1349-2004', 'sae-j1349-1990', 'iso-1585', 'din-70020'])
    expect(after!.corrections[2]!.name).toMatch(/compression ignition/)
    for (const c of after!.corrections) {
      expect(c.correctedPowerKw).toBeCloseTo(after!.powerKw * c.factor!, 9)
      expect(typeof c.valid).toBe('boolean')
      expect(c.notes.length).toBeGreaterThan(0)
    }
    // A hotter, lower-pressure day: every factor raises the figure.
    expect(after!.corrections.every(c => c.factor! > 1)).toBe(true)
  })

  it('before and after corrected power, by the workshop\'s standard, with the dyno caution', async () => {
    const reply = await clients.driver.get<Compared>(`/api/vehicles/${ids.driverCar}/dyno-comparison`)
    expect(reply.status).toBe(200)
    expect(reply.body.standard).toBe('sae-j1349-2004')
    expect(reply.body.caution).toMatch(/trained operators/)
    expect(reply.body.comparison!.changeKw).toBeGreaterThan(0)
    expect(reply.body.comparison!.dynoSpreadNote).toMatch(/Common practice, no source/)
  })
})

describe('POST /api/vehicles/:id/dyno-runs', () => {
  it.each([
    ['anonymous', 'driverCar', 401], ['owner', 'driverCar', 201], ['tuner', 'driver2Car', 201], ['fabricator', 'driverCar', 403],
    ['driver', 'driverCar', 403], ['driver2', 'driverCar', 404], ['foreignOwner', 'driverCar', 404],
  ] as const)('%s on %s → %i', async (who, car, status) => {
    const before = runCount()
    const reply = await clients[who].post<Run>(`/api/vehicles/${ids[car]}/dyno-runs`, run())
    expect(reply.status).toBe(status)
    expect(runCount()).toBe(before + (status === 201 ? 1 : 0))
  })

  it('at the standards\' own reference air every factor is 1', async () => {
    // SAE J1349: 99 kPa dry, 25 °C (298 K in the formula: √(298.15/298) = 1.000252 → 1.000296);
    // DIN 70020: 1013 mbar total, 20 °C (√(293.15/293) → 1.000256). Dry air: no humidity given.
    const sae = await clients.tuner.post<Run>(`/api/vehicles/${ids.driverCar}/dyno-runs`, run({ ambientTempC: 25, baroKpa: 99 }))
    expect(sae.body.corrections[0]!.factor).toBeCloseTo(1.000296, 5)
    expect(sae.body.corrections[1]!.factor).toBeCloseTo(1.000298, 5)
    const din = await clients.tuner.post<Run>(`/api/vehicles/${ids.driverCar}/dyno-runs`, run({ ambientTempC: 20, baroKpa: 101.3 }))
    expect(din.body.corrections[3]!.factor).toBeCloseTo(1.000256, 5)
  })

  it('uses ISO 1585 spark ignition for a petrol car, and says what a diesel run lacks without rpm', async () => {
    const petrol = await clients.tuner.post<Run>(`/api/vehicles/${ids.driver2Car}/dyno-runs`, run())
    expect(petrol.body.corrections[2]!.name).toMatch(/spark ignition/)
    const diesel = await clients.tuner.post<Run>(`/api/vehicles/${ids.driverCar}/dyno-runs`, run({ rpm: null }))
    expect(diesel.body.corrections[2]).toMatchObject({ standard: 'iso-1585', factor: null, correctedPowerKw: null, valid: false })
    expect(diesel.body.corrections[2]!.notes[0]).toMatch(/engine speed/)
  })

  it.each([
    ['no barometric pressure', run({ baroKpa: undefined }), 400, /barometric pressure/],
    ['a humidity over 100 %', run({ humidityPct: 150 }), 400, /relative humidity is between 0 and 100/],
    ['a side that is neither', run({ side: 'during' }), 400, /before or after/],
    ['an empty label', run({ label: '' }), 400, /label/],
    ['a core id that is not a positive number', run({ coreId: 0 }), 400, /core/i],
  ])('%s: a clear message, nothing stored', async (_name, input, status, message) => {
    const before = runCount()
    const reply = await clients.tuner.post<{ message: string }>(`/api/vehicles/${ids.driverCar}/dyno-runs`, input)
    expect(reply.status).toBe(status)
    expect(reply.body.message).toMatch(message)
    expect(runCount()).toBe(before)
  })

  it('a core of another workshop → 422, nothing stored', async () => {
    const before = runCount()
    const reply = await clients.tuner.post<{ message: string }>(`/api/vehicles/${ids.driverCar}/dyno-runs`, run({ coreId: ids.foreignCore }))
    expect(reply.status).toBe(422)
    expect(reply.body.message).toMatch(/core catalogue/)
    expect(runCount()).toBe(before)
  })
})

describe('reading and deleting dyno runs', () => {
  const id = () => toDelete

  it.each([
    ['anonymous', 401], ['owner', 200], ['fabricator', 200], ['driver', 200], ['driver2', 404], ['foreignOwner', 404],
  ] as const)('GET by %s → %i', async (who, status) => {
    expect((await clients[who].get(`/api/vehicles/${ids.driverCar}/dyno-runs`)).status).toBe(status)
    expect((await clients[who].get(`/api/vehicles/${ids.driverCar}/dyno-comparison`)).status).toBe(status)
  })

  it.each([
    ['anonymous', 401], ['fabricator', 403], ['driver', 403], ['driver2', 404], ['foreignOwner', 404],
  ] as const)('DELETE by %s → %i, nothing removed', async (who, status) => {
    const before = runCount()
    expect((await clients[who].delete(`/api/dyno-runs/${id()}`)).status).toBe(status)
    expect(runCount()).toBe(before)
  })

  it('the tuner deletes it', async () => {
    expect((await clients.tuner.delete(`/api/dyno-runs/${id()}`)).status).toBe(204)
    expect(one<{ n: number }>('select count(*) n from dyno_runs where id = ?', id()).n).toBe(0)
  })
})

describe('the workshop\'s correction standard', () => {
  it('the owner sets it; the comparison follows; nobody else may, and only a listed standard', async () => {
    expect((await clients.tuner.patch('/api/workshop', { correctionStandard: 'din-70020' })).status).toBe(403)
    const bad = await clients.owner.patch<{ message: string }>('/api/workshop', { correctionStandard: 'my-own' })
    expect(bad.status).toBe(400)
    expect(bad.body.message).toBe('Please check the form — choose one of the listed correction standards. Correct it and try again.')
    expect((await clients.owner.patch('/api/workshop', { correctionStandard: 'din-70020' })).status).toBe(200)
    const reply = await clients.tuner.get<Compared>(`/api/vehicles/${ids.driverCar}/dyno-comparison`)
    expect(reply.body.standard).toBe('din-70020')
    expect(reply.body.comparison!.standard).toBe('din-70020')
    expect((await clients.tuner.get<Compared>(`/api/vehicles/${ids.driverCar}/dyno-comparison?standard=iso-1585`)).body.standard).toBe('iso-1585')
    const unknown = await clients.tuner.get<{ message: string }>(`/api/vehicles/${ids.driverCar}/dyno-comparison?standard=nope`)
    expect(unknown.status).toBe(400)
    expect(unknown.body.message).toBe('Please check the values you asked for — choose one of the listed correction standards. Correct them and try again.')
    expect((await clients.owner.patch('/api/workshop', { correctionStandard: 'sae-j1349-2004' })).status).toBe(200)
  })
})
