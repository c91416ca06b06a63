import { beforeAll, describe, expect, it } from 'vitest'
import { generateDemoLog } from '../../server/analysis'
import { Client, readDatabase, signIn, useTestServer } from './client'

await useTestServer()

type Who = 'anonymous' | 'owner' | 'tuner' | 'fabricator' | 'driver' | 'driver2' | 'foreignOwner'
const clients = {} as Record<Who, Client>
const ids = { driverCar: 0, driver2Car: 0, foreignCar: 0, stockLog: 0, frontLog: 0, stockCore: 0, frontCore: 0, otherCore: 0, foreignCore: 0, foreignLog: 0 }
const demoFile = (name: string, scenario: 'stock-core-hot-day' | 'front-mount-after' = 'front-mount-after') => ({ name, content: generateDemoLog(scenario).csv })

interface Side { logIds: number[], pullCount: number, meanEffectiveness: number, meanDeltaOverAmbientK: number, ambientTempC: number, meanChargeTempC: number, chargeTempAtReferenceC: number }
interface Comparison {
  id: number
  vehicleId: number
  referenceAmbientC: number
  before: Side
  after: Side
  effectivenessGain: number
  deltaOverAmbientChangeK: number
  chargeTempAtReferenceChangeK: number
  powerRecoveredPct: number
  intervals: { effectivenessGain: [number, number], deltaOverAmbientChangeK: [number, number] }
  unmatchedPulls: unknown[]
  verdict: string
  warnings: Array<{ code: string }>
  stale: boolean
  staleAt: string | null
}

const count = (table: string) => readDatabase(db => (db.prepare(`select count(*) n from ${table}`).get() as { n: number }).n)
const footprint = () => ({ comparisons: count('comparisons'), sides: count('comparison_logs') })
const one = <T>(sql: string, ...args: unknown[]) => readDatabase(db => db.prepare(sql).get(...args) as T)

async function upload(client: Client, vehicleId: number, name: string, fields: Record<string, string | number> = {}) {
  const reply = await client.upload<{ id: number }>('/api/logs', { vehicleId, ...fields }, demoFile(name))
  expect(reply.status, JSON.stringify(reply.body)).toBe(201)
  return reply.body.id
}

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
  ids.stockLog = one<{ id: number }>('select id from logs where original_name = ?', 'demo-stock-core-mild-day.csv').id
  ids.frontLog = one<{ id: number }>('select id from logs where original_name = ? order by id limit 1', 'demo-front-mount-after.csv').id
  ids.stockCore = one<{ id: number }>('select id from cores where kind = ? and name like ?', 'stock', 'Factory%').id
  ids.frontCore = one<{ id: number }>('select id from cores where name like ?', 'Kestrel bar-and-plate%').id
  ids.otherCore = one<{ id: number }>('select id from cores where name like ?', 'Compact front-mount%').id
  ids.foreignCore = one<{ id: number }>('select id from cores where name like ?', 'Harbourside%').id
  ids.foreignLog = await upload(clients.foreignOwner, ids.foreignCar, 'foreign.csv')
  // Logs that cannot be compared: another car's, one whose pulls were all left out, one without
  // a pre-cooler temperature or boost to work effectiveness out from.
  otherCarLog = await upload(clients.tuner, ids.driver2Car, 'other-car.csv')
  noPullsLog = await upload(clients.tuner, ids.driverCar, 'no-pulls.csv')
  const removed = await clients.tuner.patch(`/api/logs/${noPullsLog}`, { pullEdits: { remove: [0, 1, 2, 3, 4, 5] } })
  expect(removed.status).toBe(200)
  noEffectivenessLog = await upload(clients.tuner, ids.driverCar, 'no-sensor.csv', { mapping: JSON.stringify({ preCoolerTemp: null, manifoldPressure: null }) })
  readId = (await clients.tuner.post<{ id: number }>('/api/comparisons', body({ title: 'to read' }))).body.id
})

let otherCarLog = 0
let noPullsLog = 0
let noEffectivenessLog = 0
let readId = 0

const body = (extra: Record<string, unknown> = {}) => ({ vehicleId: ids.driverCar, beforeLogIds: [ids.stockLog], afterLogIds: [ids.frontLog], ...extra })

describe('the demo pair', () => {
  it('each demo log records the core fitted when it was made, and the report names it', async () => {
    const stock = await clients.driver.get<{ core: { name: string } }>(`/api/logs/${ids.stockLog}/core`)
    expect(stock.body.core.name).toMatch(/^Factory side-mount core/)
    const front = await clients.driver.get<{ core: { name: string } }>(`/api/logs/${ids.frontLog}/core`)
    expect(front.body.core.name).toMatch(/^Kestrel bar-and-plate front-mount/)
  })

  it('is stored as a comparison that shows the improvement the raw charge temperatures hide', async () => {
    const list = await clients.tuner.get<Array<{ id: number, title: string }>>(`/api/comparisons?vehicleId=${ids.driverCar}`)
    expect(list.status).toBe(200)
    const demo = list.body.find(c => c.title === 'Factory core against the front-mount')!
    const reply = await clients.driver.get<Comparison>(`/api/comparisons/${demo.id}`)
    expect(reply.status).toBe(200)
    const c = reply.body
    expect(c).toMatchObject({ id: demo.id, vehicleId: ids.driverCar, referenceAmbientC: 25 })
    expect(c.before.logIds).toEqual([ids.stockLog])
    expect(c.after.logIds).toEqual([ids.frontLog])
    expect(c.before.pullCount).toBe(6)
    // The after day was hotter and its logged charge air no cooler...
    expect(c.after.ambientTempC).toBeGreaterThan(c.before.ambientTempC + 10)
    expect(c.after.meanChargeTempC).toBeGreaterThan(c.before.meanChargeTempC - 1)
    expect(c.warnings.map(w => w.code)).toContain('raw-misleads')
    // ...yet the after core is better, beyond the noise.
    expect(c.effectivenessGain).toBeCloseTo(c.after.meanEffectiveness - c.before.meanEffectiveness, 12)
    expect(c.intervals.effectivenessGain[0]).toBeGreaterThan(0)
    expect(c.deltaOverAmbientChangeK).toBeLessThan(0)
    expect(c.intervals.deltaOverAmbientChangeK[1]).toBeLessThan(0)
    expect(c.chargeTempAtReferenceChangeK).toBeLessThan(-10)
    expect(c.powerRecoveredPct).toBeGreaterThan(3)
    expect(c.unmatchedPulls).toEqual([])
    expect(c.verdict).toMatch(/^The after core works better/)
  })
})

// What each refusal says: sign in; the role does not build comparisons; the car is not theirs to see.
const REFUSALS: Record<number, string> = {
  401: 'Sign in first: this needs a Densitas account.',
  403: 'Only a tuner or the workshop owner builds comparisons. You can read the ones on this car.',
  404: 'Car not found. Check the link, or ask the workshop for a new one.',
}
// Staff of another workshop are told why a car may be gone, not to ask "the workshop".
const STAFF_NOT_FOUND = 'Car not found. It may have been deleted, or it belongs to another workshop. Open it again from the list.'

describe('POST /api/comparisons', () => {
  it.each([
    ['anonymous', 'driverCar', 401], ['owner', 'driverCar', 201], ['tuner', 'driverCar', 201], ['fabricator', 'driverCar', 403],
    ['driver', 'driverCar', 403], ['driver2', 'driverCar', 404], ['foreignOwner', 'driverCar', 404],
  ] as const)('%s on %s → %i', async (who, car, status) => {
    const before = footprint()
    const reply = await clients[who].post<{ id: number, message?: string }>('/api/comparisons', body({ vehicleId: ids[car] }))
    expect(reply.status).toBe(status)
    if (status === 201) {
      expect(Object.keys(reply.body)).toEqual(['id'])
      expect(footprint()).toEqual({ comparisons: before.comparisons + 1, sides: before.sides + 2 })
    }
    else {
      expect(reply.body.message).toBe(who === 'foreignOwner' ? STAFF_NOT_FOUND : REFUSALS[status])
      expect(footprint()).toEqual(before)
    }
  })

  it('takes a reference ambient the user chooses', async () => {
    const reply = await clients.tuner.post<{ id: number }>('/api/comparisons', body({ referenceAmbientC: 35, title: 'On a 35 °C day' }))
    const c = (await clients.tuner.get<Comparison & { title: string }>(`/api/comparisons/${reply.body.id}`)).body
    expect(c.referenceAmbientC).toBe(35)
    expect(c.title).toBe('On a 35 °C day')
    // Hotter reference, hotter charge air for both cores.
    const at25 = (await clients.tuner.get<Array<{ id: number, referenceAmbientC: number }>>(`/api/comparisons?vehicleId=${ids.driverCar}`)).body.find(x => x.referenceAmbientC === 25)!
    const c25 = (await clients.tuner.get<Comparison>(`/api/comparisons/${at25.id}`)).body
    expect(c.before.chargeTempAtReferenceC).toBeGreaterThan(c25.before.chargeTempAtReferenceC + 9)
  })
})

describe('choices that cannot be compared: a clear 4xx, nothing stored', () => {
  it.each([
    ['a log of another car', () => body({ afterLogIds: [otherCarLog] }), 422, /other-car\.csv\) belongs to another car/],
    ['an empty before side', () => body({ beforeLogIds: [] }), 422, /at least one log for the before side/],
    ['an empty after side', () => body({ afterLogIds: [] }), 422, /at least one log for the after side/],
    ['the same log on both sides', () => body({ afterLogIds: [ids.stockLog] }), 422, /demo-stock-core-mild-day\.csv\) is on both sides/],
    ['a log with no pulls', () => body({ afterLogIds: [noPullsLog] }), 422, /no-pulls\.csv\) has no pulls/],
    ['a log whose effectiveness cannot be worked out', () => body({ afterLogIds: [noEffectivenessLog] }), 422, /no-sensor\.csv\) cannot be worked out: it has no pre-cooler temperature and no boost reading/],
    ['a log of another workshop', () => body({ afterLogIds: [ids.foreignLog] }), 404, /not found/],
    ['a reference ambient out of range', () => body({ referenceAmbientC: 90 }), 400, /between −30 and 55 °C/],
    ['a log id that is not a number', () => body({ afterLogIds: ['x'] }), 400, /check the form/i],
    ['no car', () => ({ beforeLogIds: [ids.stockLog], afterLogIds: [ids.frontLog] }), 400, /choose the car/],
  ])('%s', async (_name, make, status, message) => {
    const before = footprint()
    const reply = await clients.tuner.post<{ message: string, data?: { logId?: number } }>('/api/comparisons', make())
    expect(reply.status).toBe(status)
    expect(reply.body.message).toMatch(message)
    // Messages about the choice of logs are for people: no field names.
    if (status === 422) expect(reply.body.message).not.toMatch(/vehicleId|LogIds/)
    expect(footprint()).toEqual(before)
  })

  it('names the log in the reply data too', async () => {
    const reply = await clients.tuner.post<{ data: { logId: number, code: string } }>('/api/comparisons', body({ afterLogIds: [noPullsLog] }))
    expect(reply.body.data).toMatchObject({ code: 'NO_PULLS', logId: noPullsLog })
  })
})

describe('reading and deleting comparisons', () => {
  const id = () => readId

  it.each([
    ['anonymous', 401], ['owner', 200], ['tuner', 200], ['fabricator', 200], ['driver', 200], ['driver2', 404], ['foreignOwner', 404],
  ] as const)('GET by %s → %i', async (who, status) => {
    expect((await clients[who].get(`/api/comparisons/${id()}`)).status).toBe(status)
  })

  it.each([
    ['anonymous', 401], ['driver', 200], ['fabricator', 200], ['driver2', 404], ['foreignOwner', 404],
  ] as const)('the list of the car by %s → %i', async (who, status) => {
    const reply = await clients[who].get<Array<{ id: number }>>(`/api/comparisons?vehicleId=${ids.driverCar}`)
    expect(reply.status).toBe(status)
    if (status === 200) expect(reply.body.map(c => c.id)).toContain(id())
  })

  it('a driver\'s list holds only their own cars\' comparisons', async () => {
    const reply = await clients.driver2.get<Array<{ vehicleId: number }>>('/api/comparisons')
    expect(reply.status).toBe(200)
    expect(reply.body.every(c => c.vehicleId === ids.driver2Car)).toBe(true)
  })

  it.each([
    ['anonymous', 401], ['fabricator', 403], ['driver', 403], ['driver2', 404], ['foreignOwner', 404],
  ] as const)('DELETE by %s → %i, nothing removed', async (who, status) => {
    const before = footprint()
    expect((await clients[who].delete(`/api/comparisons/${id()}`)).status).toBe(status)
    expect(footprint()).toEqual(before)
  })

  it('the tuner deletes it, and then it is gone', async () => {
    expect((await clients.tuner.delete(`/api/comparisons/${id()}`)).status).toBe(204)
    expect((await clients.tuner.get(`/api/comparisons/${id()}`)).status).toBe(404)
    expect(one<{ n: number }>('select count(*) n from comparison_logs where comparison_id = ?', id()).n).toBe(0)
  })
})

describe('a comparison goes stale when a log\'s pulls change', () => {
  it('says so, and recomputing brings it up to date', async () => {
    const log = await upload(clients.tuner, ids.driverCar, 'stale.csv')
    const id = (await clients.tuner.post<{ id: number }>('/api/comparisons', body({ afterLogIds: [log] }))).body.id
    expect((await clients.tuner.get<Comparison>(`/api/comparisons/${id}`)).body.stale).toBe(false)
    expect((await clients.tuner.patch(`/api/logs/${log}`, { pullEdits: { remove: [0] } })).status).toBe(200)
    const stale = (await clients.driver.get<Comparison>(`/api/comparisons/${id}`)).body
    expect(stale.stale).toBe(true)
    expect(stale.after.pullCount).toBe(6)
    expect((await clients.driver.post(`/api/comparisons/${id}/recompute`)).status).toBe(403)
    expect((await clients.foreignOwner.post(`/api/comparisons/${id}/recompute`)).status).toBe(404)
    const fresh = await clients.tuner.post<Comparison>(`/api/comparisons/${id}/recompute`)
    expect(fresh.status).toBe(200)
    expect(fresh.body.stale).toBe(false)
    expect(fresh.body.after.pullCount).toBe(5)
  })
})

describe('a shared comparison', () => {
  it('opens without signing in, shows only what the page shows, and is withdrawn like a report link', async () => {
    const id = (await clients.tuner.post<{ id: number }>('/api/comparisons', body({ title: 'shared' }))).body.id
    expect((await clients.fabricator.post(`/api/comparisons/${id}/share`, {})).status).toBe(403)
    expect((await clients.driver.post(`/api/comparisons/${id}/share`, {})).status).toBe(403)
    expect((await clients.foreignOwner.post(`/api/comparisons/${id}/share`, {})).status).toBe(404)
    const link = await clients.tuner.post<{ id: number, url: string }>(`/api/comparisons/${id}/share`, { expiresInDays: 7 })
    expect(link.status).toBe(201)
    const token = link.body.url.split('/shared/')[1]!
    const shared = await new Client().get<Record<string, unknown> & { before: Record<string, unknown>, pulls: Array<Record<string, unknown>> }>(`/api/shared/${token}`)
    expect(shared.status).toBe(200)
    expect(shared.body).toMatchObject({ kind: 'comparison', workshopName: 'Kestrel Road Performance', title: 'shared' })
    expect(typeof shared.body.verdict).toBe('string')
    // No internal ids or staff fields anywhere in the reply.
    const text = JSON.stringify(shared.body)
    expect(text).not.toMatch(/"(id|vehicleId|logId|logIds|createdById|recommendation|ownerId|workshopId)"/)
    expect(shared.body.pulls[0]).toHaveProperty('log')
    const links = await clients.tuner.get<Array<{ id: number }>>(`/api/comparisons/${id}/shares`)
    expect(links.body.map(l => l.id)).toContain(link.body.id)
    expect((await clients.driver.get(`/api/comparisons/${id}/shares`)).status).toBe(403)
    expect((await clients.tuner.delete(`/api/share-links/${link.body.id}`)).status).toBe(204)
    expect((await new Client().get(`/api/shared/${token}`)).status).toBe(404)
  })
})

describe('the core fitted when a log was made', () => {
  // Fitting a core goes through the car's edit; send the fields a partial edit would reset with it.
  const refit = (coreId: number) => {
    const car = one<{ rated_power_kw: number | null, notes: string, registration: string }>('select rated_power_kw, notes, registration from vehicles where id = ?', ids.driverCar)
    return clients.tuner.patch(`/api/vehicles/${ids.driverCar}`, { fittedCoreId: coreId, ratedPowerKw: car.rated_power_kw, notes: car.notes, registration: car.registration })
  }

  it('comes from the car at upload, and fitting another core later does not rewrite older logs', async () => {
    const log = await upload(clients.tuner, ids.driverCar, 'core-at-upload.csv')
    const fitted = one<{ fitted_core_id: number }>('select fitted_core_id from vehicles where id = ?', ids.driverCar).fitted_core_id
    expect(one<{ core_id: number }>('select core_id from logs where id = ?', log).core_id).toBe(fitted)
    expect((await refit(ids.otherCore)).status).toBe(200)
    expect(one<{ core_id: number }>('select core_id from logs where id = ?', log).core_id).toBe(fitted)
    expect(one<{ core_id: number }>('select core_id from logs where id = ?', ids.stockLog).core_id).toBe(ids.stockCore)
    const next = await upload(clients.tuner, ids.driverCar, 'after-refit.csv')
    expect(one<{ core_id: number }>('select core_id from logs where id = ?', next).core_id).toBe(ids.otherCore)
    expect((await refit(fitted)).status).toBe(200)
  })

  it('staff may name another catalogue core at upload; a driver may not, nor a core of another workshop', async () => {
    const log = await upload(clients.tuner, ids.driverCar, 'named-core.csv', { coreId: ids.stockCore })
    expect(one<{ core_id: number }>('select core_id from logs where id = ?', log).core_id).toBe(ids.stockCore)
    const logs = count('logs')
    expect((await clients.driver.upload('/api/logs', { vehicleId: ids.driverCar, coreId: ids.stockCore }, demoFile('x.csv'))).status).toBe(403)
    const foreign = await clients.tuner.upload<{ message: string }>('/api/logs', { vehicleId: ids.driverCar, coreId: ids.foreignCore }, demoFile('y.csv'))
    expect(foreign.status).toBe(422)
    expect(foreign.body.message).toMatch(/not in your workshop's core catalogue/)
    expect(count('logs')).toBe(logs)
  })

  it.each([
    ['anonymous', 401], ['owner', 200], ['tuner', 200], ['fabricator', 200], ['driver', 403], ['driver2', 404], ['foreignOwner', 404],
  ] as const)('changing it on the report by %s → %i', async (who, status) => {
    const reply = await clients[who].request<{ core: { id: number } }>('PUT', `/api/logs/${ids.frontLog}/core`, { coreId: ids.frontCore })
    expect(reply.status).toBe(status)
    expect(one<{ core_id: number }>('select core_id from logs where id = ?', ids.frontLog).core_id).toBe(ids.frontCore)
  })

  it('refuses a core of another workshop and leaves the log as it was', async () => {
    const reply = await clients.tuner.request<{ message: string }>('PUT', `/api/logs/${ids.frontLog}/core`, { coreId: ids.foreignCore })
    expect(reply.status).toBe(422)
    expect(one<{ core_id: number }>('select core_id from logs where id = ?', ids.frontLog).core_id).toBe(ids.frontCore)
  })
})

describe('GET /api/cores/:id/evidence', () => {
  it.each([
    ['anonymous', 401], ['owner', 200], ['tuner', 200], ['fabricator', 200], ['driver', 403], ['foreignOwner', 404],
  ] as const)('by %s → %i', async (who, status) => {
    expect((await clients[who].get(`/api/cores/${ids.frontCore}/evidence`)).status).toBe(status)
  })

  it('counts the workshop\'s logs with the core, with median and spread', async () => {
    const reply = await clients.tuner.get<{ coreId: number, logCount: number, pullCount: number, effectiveness: { median: number, p10: number, p90: number }, deltaOverAmbientK: { median: number, p10: number, p90: number }, vehicles: Array<{ id: number }> }>(`/api/cores/${ids.frontCore}/evidence`)
    const logs = one<{ n: number }>('select count(*) n from logs where core_id = ?', ids.frontCore).n
    expect(reply.body.coreId).toBe(ids.frontCore)
    expect(reply.body.logCount).toBe(logs)
    expect(reply.body.pullCount).toBeGreaterThanOrEqual(6)
    expect(reply.body.effectiveness.p10).toBeLessThanOrEqual(reply.body.effectiveness.median)
    expect(reply.body.effectiveness.median).toBeLessThanOrEqual(reply.body.effectiveness.p90)
    // Other test files upload logs to this car too (recorded with whatever core is fitted then),
    // so the figures are checked for shape, not for the demo core's own ε ≈ 0.84.
    expect(reply.body.effectiveness.median).toBeGreaterThan(0)
    expect(reply.body.effectiveness.median).toBeLessThan(1)
    expect(reply.body.deltaOverAmbientK.p10).toBeLessThanOrEqual(reply.body.deltaOverAmbientK.p90)
    expect(reply.body.vehicles.map(v => v.id)).toContain(ids.driverCar)
  })

  it('a core of another workshop is not found', async () => {
    expect((await clients.tuner.get(`/api/cores/${ids.foreignCore}/evidence`)).status).toBe(404)
  })
})

describe('the picker and the core line read the same rules as the car', () => {
  it.each([
    ['anonymous', 401], ['owner', 200], ['tuner', 200], ['fabricator', 200], ['driver', 200], ['driver2', 404], ['foreignOwner', 404],
  ] as const)('GET log choices and a log\'s core by %s → %i', async (who, status) => {
    expect((await clients[who].get(`/api/vehicles/${ids.driverCar}/log-choices`)).status).toBe(status)
    expect((await clients[who].get(`/api/logs/${ids.stockLog}/core`)).status).toBe(status)
  })

  it('the picker shows day, core, ambient temperature, pull count and mean effectiveness per log', async () => {
    const reply = await clients.tuner.get<Array<{ id: number, recordedOn: string, coreName: string, ambientTempC: number, pullCount: number, meanEffectiveness: number }>>(`/api/vehicles/${ids.driverCar}/log-choices`)
    const stock = reply.body.find(l => l.id === ids.stockLog)!
    expect(stock).toMatchObject({ recordedOn: '2026-04-18', pullCount: 6 })
    expect(stock.coreName).toMatch(/^Factory side-mount core/)
    expect(stock.ambientTempC).toBeCloseTo(14, 0)
    expect(stock.meanEffectiveness).toBeGreaterThan(0.6)
    expect(reply.body.every(l => !('mapping' in l))).toBe(true)
  })
})
