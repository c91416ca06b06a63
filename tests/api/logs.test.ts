import { readdirSync, readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { generateDemoLog } from '../../server/analysis'
import { Client, logFootprint, readDatabase, signIn, useTestServer } from './client'

await useTestServer()

const fixture = (name: string) => readFileSync(resolve(import.meta.dirname, '..', 'fixtures', 'real', name), 'utf8')
const demo = generateDemoLog('stock-core-hot-day')
const demoFile = { name: 'hot-day.csv', content: demo.csv }

const clients = {} as Record<'anonymous' | 'owner' | 'tuner' | 'fabricator' | 'driver' | 'driver2' | 'foreignOwner', Client>
const ids = { driverCar: 0, driver2Car: 0, foreignCar: 0 }
let tunerLog = 0

const WHAT_IF_RANGE = 'Please check the values you asked for — give an ambient temperature between −30 and 55 °C. Correct them and try again.'

interface Detail { id: number, vehicleId: number, conditions: Record<string, number>, notes: string, channels: string[] }
interface Analysis { summary: { pullCount: number, soakIndexKPerPull: number | null }, pulls: Array<{ index: number, startS: number, endS: number }>, masks: Array<{ reason: string }> }

beforeAll(async () => {
  clients.anonymous = new Client()
  clients.owner = await signIn('owner@kestrel.test')
  clients.tuner = await signIn('tuner@kestrel.test')
  clients.fabricator = await signIn('fab@kestrel.test')
  clients.driver = await signIn('driver@kestrel.test')
  clients.driver2 = await signIn('driver2@kestrel.test')
  clients.foreignOwner = await signIn('owner@harbourside.test')
  const carOf = (email: string) => readDatabase(db => (db.prepare('select v.id from vehicles v join users u on u.id = v.owner_id where u.email = ? order by v.id limit 1').get(email) as { id: number }).id)
  ids.driverCar = carOf('driver@kestrel.test')
  ids.driver2Car = carOf('driver2@kestrel.test')
  ids.foreignCar = carOf('driver@harbourside.test')
  const uploaded = await clients.tuner.upload<Detail>('/api/logs', { vehicleId: ids.driverCar, notes: 'baseline' }, demoFile)
  expect(uploaded.status).toBe(201)
  tunerLog = uploaded.body.id
})

describe('the demo seed', () => {
  it('carries the two invented logs of the hatchback, analysed', async () => {
    const list = await clients.driver.get<Array<{ originalName: string, summary: { pullCount: number, soakIndexKPerPull: number } }>>(`/api/logs?vehicleId=${ids.driverCar}`)
    const names = list.body.map(l => l.originalName)
    expect(names).toEqual(expect.arrayContaining(['demo-stock-core-mild-day.csv', 'demo-front-mount-after.csv']))
    const hot = list.body.find(l => l.originalName === 'demo-stock-core-mild-day.csv')!
    expect(hot.summary.pullCount).toBe(6)
    expect(hot.summary.soakIndexKPerPull).toBeGreaterThan(0)
  })
})

describe('POST /api/logs', () => {
  it.each([
    ['anonymous', 'driverCar', 401], ['owner', 'driverCar', 201], ['tuner', 'driver2Car', 201], ['fabricator', 'driverCar', 403],
    ['driver', 'driverCar', 201], ['driver', 'driver2Car', 404], ['driver2', 'driverCar', 404], ['foreignOwner', 'driverCar', 404],
  ] as const)('%s uploading to %s → %i', async (who, car, status) => {
    const before = logFootprint()
    const reply = await clients[who].upload<Detail & { message?: string }>('/api/logs', { vehicleId: ids[car] }, demoFile)
    expect(reply.status).toBe(status)
    const after = logFootprint()
    if (status === 201) {
      expect(reply.body.vehicleId).toBe(ids[car])
      expect(after).toEqual({ logs: before.logs + 1, analyses: before.analyses + 1, files: before.files + 1 })
    }
    else {
      expect(after).toEqual(before)
    }
  })

  it('records who uploaded what', () => {
    const event = readDatabase(db => db.prepare('select action, user_id, detail from audit_events where entity = \'log\' and entity_id = ?').get(tunerLog) as { action: string, detail: string })
    expect(event.action).toBe('uploaded')
    expect(JSON.parse(event.detail)).toMatchObject({ originalName: 'hot-day.csv', vehicleId: ids.driverCar })
  })

  it('stores the file under its id, never under the uploaded name', () => {
    const folder = resolve(inject('dataDir'), 'uploads', 'logs')
    const names = readdirSync(folder)
    expect(names).toContain(String(tunerLog))
    expect(names.some(name => name.includes('hot-day'))).toBe(false)
    expect(readFileSync(resolve(folder, String(tunerLog)), 'utf8')).toBe(demo.csv)
  })

  const badInputs: Array<[string, Record<string, string | number>, { name: string, content: string | Uint8Array } | undefined, number, RegExp]> = [
    ['no file', {}, undefined, 400, /No file was attached/],
    ['an empty file', {}, { name: 'empty.csv', content: '' }, 400, /is empty/],
    ['a header only', {}, { name: 'header.csv', content: 'Time (s),Charge air temp (°C),Ambient temp (°C)\n' }, 422, /header|no data|rows/i],
    ['a file that is not text', {}, { name: 'binary.csv', content: new Uint8Array(Array.from({ length: 4096 }, (_, i) => (i * 37) % 256)) }, 422, /text|CSV/i],
    ['no temperature column', {}, { name: 'notemp.csv', content: 'Time (s),Engine speed (rpm),Pedal (%)\n0,800,0\n1,900,10\n2,1000,20\n' }, 422, /temperature column/],
    ['a wrong unit in the mapping', { mapping: JSON.stringify({ chargeTemp: { column: 'Charge air temp (°C)', unit: 'psi' } }) }, demoFile, 422, /psi/],
    ['a mapping that is not JSON', { mapping: '{chargeTemp' }, demoFile, 422, /mapping/i],
    ['the wrong file type', {}, { name: 'log.xlsx', content: demo.csv }, 415, /not a text log/],
    ['an ambient temperature that is not a number', { ambientTempC: 'warm' }, demoFile, 400, /the ambient temperature must be a number/],
    ['an ambient temperature out of range', { ambientTempC: 95 }, demoFile, 400, /between −40 and 60/],
  ]

  it.each(badInputs)('answers %s with a 4xx and a message, and leaves nothing behind', async (_label, fields, file, status, message) => {
    const before = logFootprint()
    const reply = await clients.tuner.upload<{ message: string }>('/api/logs', { vehicleId: ids.driverCar, ...fields }, file)
    expect(reply.status).toBe(status)
    expect(reply.body.message).toMatch(message)
    expect(logFootprint()).toEqual(before)
  })

  it('refuses a file over the size limit with 413 and keeps nothing', async () => {
    const before = logFootprint()
    const big = new Uint8Array(51 * 1024 * 1024).fill(0x31)
    const reply = await clients.tuner.upload<{ message: string }>('/api/logs', { vehicleId: ids.driverCar }, { name: 'huge.csv', content: big })
    expect(reply.status).toBe(413)
    expect(reply.body.message).toMatch(/50 MB/)
    expect(logFootprint()).toEqual(before)
  })

  it('asks for the ambient temperature when the log has none, then analyses the real petrol excerpt', async () => {
    const file = { name: 'petrol.csv', content: fixture('petrol-start-excerpt.csv') }
    const before = logFootprint()
    const missing = await clients.tuner.upload<{ message: string }>('/api/logs', { vehicleId: ids.driver2Car }, file)
    expect(missing.status).toBe(422)
    expect(missing.body.message).toBe('This log has no ambient temperature column. Enter the ambient temperature during the pulls (°C), so the charge temperature can be compared with it, and upload the log again.')
    expect(logFootprint()).toEqual(before)
    const given = await clients.tuner.upload<Detail>('/api/logs', { vehicleId: ids.driver2Car, ambientTempC: 32 }, file)
    expect(given.status).toBe(201)
    expect(given.body.conditions.ambientTempC).toBe(32)
  })

  it('marks the engine-stop artefact of the real diesel excerpt instead of analysing it', async () => {
    const reply = await clients.tuner.upload<Detail>('/api/logs', { vehicleId: ids.driverCar }, { name: 'diesel.csv', content: fixture('diesel-engine-stop-excerpt.csv') })
    expect(reply.status).toBe(201)
    const analysis = await clients.tuner.get<Analysis>(`/api/logs/${reply.body.id}/analysis`)
    expect(analysis.body.masks.length).toBeGreaterThan(0)
  })
})

describe('reading a log', () => {
  const routes = (id: number) => [
    `/api/logs/${id}`, `/api/logs/${id}/analysis`, `/api/logs/${id}/series?channels=chargeTemp`,
    `/api/logs/${id}/download`, `/api/logs/${id}/export.csv`, `/api/logs/${id}/what-if?ambientC=35`,
  ]

  it.each([
    ['owner', 200], ['tuner', 200], ['fabricator', 200], ['driver', 200], ['driver2', 404], ['foreignOwner', 404], ['anonymous', 401],
  ] as const)('%s → %i on every read route of the driver\'s log', async (who, status) => {
    for (const path of routes(tunerLog)) expect((await clients[who].get(path)).status, path).toBe(status)
  })

  it('lists only what each person may see', async () => {
    const driverList = await clients.driver2.get<Array<{ vehicleId: number }>>('/api/logs')
    expect(driverList.body.every(l => l.vehicleId === ids.driver2Car)).toBe(true)
    const foreign = await clients.foreignOwner.get<Array<{ id: number }>>('/api/logs')
    expect(foreign.body.map(l => l.id)).not.toContain(tunerLog)
  })

  it('returns the analysis in the engine\'s shape', async () => {
    const reply = await clients.driver.get<Analysis & { warnings: unknown[], mapping: Record<string, unknown> }>(`/api/logs/${tunerLog}/analysis`)
    expect(reply.body.summary.pullCount).toBe(6)
    expect(Object.keys(reply.body).sort()).toEqual(['drive', 'driveDetail', 'mapping', 'masks', 'pulls', 'summary', 'warnings'])
  })

  it('downsamples series to the asked number of points inside the asked window', async () => {
    const reply = await clients.tuner.get<{ fromS: number, toS: number, series: Array<{ channel: string, t: number[], v: Array<number | null> }> }>(`/api/logs/${tunerLog}/series?channels=chargeTemp,ambientTemp&from=100&to=300&points=50`)
    expect(reply.status).toBe(200)
    expect(reply.body.series.map(s => s.channel)).toEqual(['chargeTemp', 'ambientTemp'])
    for (const series of reply.body.series) {
      expect(series.t.length).toBeGreaterThan(10)
      expect(series.t.length).toBeLessThanOrEqual(50)
      expect(Math.min(...series.t)).toBeGreaterThanOrEqual(100)
      expect(Math.max(...series.t)).toBeLessThanOrEqual(300)
    }
    const bad = await clients.tuner.get<{ message: string }>(`/api/logs/${tunerLog}/series?channels=coffee`)
    expect(bad.status).toBe(400)
    expect(bad.body.message).toBe('Please check the values you asked for — the chart asked for sensors Densitas does not know. Correct them and try again.')
  })

  it('gives back the original file', async () => {
    const reply = await clients.driver.get<string>(`/api/logs/${tunerLog}/download`)
    expect(reply.body).toBe(demo.csv)
    expect(reply.headers.get('content-disposition')).toContain('hot-day.csv')
  })

  it('works out the same car on a 35 °C day', async () => {
    const reply = await clients.driver.get<{ ambientTempC: number, pulls: Array<{ chargeTempC: number }> }>(`/api/logs/${tunerLog}/what-if?ambientC=35`)
    const analysis = await clients.driver.get<{ pulls: Array<{ meanChargeTempC: number }> }>(`/api/logs/${tunerLog}/analysis`)
    expect(reply.body.pulls).toHaveLength(6)
    // A hotter day than the 31 °C of the log gives hotter charge air on every pull.
    reply.body.pulls.forEach((pull, i) => expect(pull.chargeTempC).toBeGreaterThan(analysis.body.pulls[i]!.meanChargeTempC))
    // Pull 5 worked by hand from the demo file's logged means (tests/unit/analysis/demo-pinned.test.ts):
    // pre-cooler 392.5321 K, charge 336.2828 K, ambient 304.3410 K → measured ε = 56.2493/88.1910 = 0.637811.
    // At 35 °C (308.15 K) the pre-cooler temperature scales with the air the turbo draws in
    // (sheet §4, same pressure ratio): 392.5321 · 308.15/304.3410 = 397.4449 K; the core keeps its ε:
    // charge = 397.4449 − 0.637811 · (397.4449 − 308.15) = 340.4916 K = 67.34 °C. The report rounds
    // its figures (0.01 K, 4 digits of ε), so one decimal is checked.
    expect(reply.body.pulls[4]!.chargeTempC).toBeCloseTo(67.34, 1)
    const wrong = await clients.driver.get<{ message: string }>(`/api/logs/${tunerLog}/what-if?ambientC=300`)
    expect(wrong.status).toBe(400)
    expect(wrong.body.message).toBe(WHAT_IF_RANGE)
  })
})

describe('CSV export', () => {
  it('neutralises cells that a spreadsheet would run as formulas', async () => {
    const uploaded = await clients.tuner.upload<Detail>('/api/logs', { vehicleId: ids.driverCar, notes: '=HYPERLINK("http://example.invalid","click")' }, { name: '@sum.csv', content: demo.csv })
    const reply = await clients.tuner.get<string>(`/api/logs/${uploaded.body.id}/export.csv`)
    expect(reply.status).toBe(200)
    expect(reply.body).toContain('Notes,"\'=HYPERLINK(""http://example.invalid"",""click"")"')
    expect(reply.body).toContain('Log file,\'@sum.csv')
    expect(reply.body).not.toMatch(/,=HYPERLINK/)
    // One line per pull after the header block.
    expect(reply.body.trim().split('\r\n').filter(line => /^\d+,/.test(line))).toHaveLength(6)
  })
})

describe('PATCH /api/logs/:id', () => {
  it.each([
    ['fabricator', 403], ['driver2', 404], ['foreignOwner', 404], ['anonymous', 401],
  ] as const)('%s → %i', async (who, status) => {
    expect((await clients[who].patch(`/api/logs/${tunerLog}`, { notes: 'x' })).status).toBe(status)
  })

  it('re-analyses when a tuner removes and adds a pull', async () => {
    const before = await clients.tuner.get<Analysis>(`/api/logs/${tunerLog}/analysis`)
    const first = before.body.pulls[0]!
    expect((await clients.tuner.patch(`/api/logs/${tunerLog}`, { pullEdits: { remove: [0] } })).status).toBe(200)
    const removed = await clients.tuner.get<Analysis>(`/api/logs/${tunerLog}/analysis`)
    expect(removed.body.summary.pullCount).toBe(before.body.summary.pullCount - 1)
    expect(removed.body.pulls.some(p => Math.abs(p.startS - first.startS) < 0.5)).toBe(false)

    expect((await clients.tuner.patch(`/api/logs/${tunerLog}`, { pullEdits: { remove: [0], add: [{ startS: first.startS, endS: first.endS }] } })).status).toBe(200)
    const added = await clients.tuner.get<Analysis>(`/api/logs/${tunerLog}/analysis`)
    expect(added.body.summary.pullCount).toBe(before.body.summary.pullCount)
  })

  it('keeps notes and re-analyses with a new ambient temperature', async () => {
    const reply = await clients.driver.patch<Detail>(`/api/logs/${tunerLog}`, { notes: 'felt flat after pull three', ambientTempC: 30 })
    expect(reply.status).toBe(200)
    expect(reply.body.notes).toBe('felt flat after pull three')
    expect(reply.body.conditions.ambientTempC).toBe(30)
  })

  it('refuses conditions outside the upload form\'s bounds, in the same words, and changes nothing', async () => {
    const before = await clients.tuner.get<Detail>(`/api/logs/${tunerLog}`)
    const hot = await clients.tuner.patch<{ message: string }>(`/api/logs/${tunerLog}`, { ambientTempC: 80 })
    expect(hot.status).toBe(400)
    expect(hot.body.message).toBe('Please check the form — The ambient temperature must be between −40 and 60 °C. Correct it and try again.')
    const low = await clients.tuner.patch<{ message: string }>(`/api/logs/${tunerLog}`, { baroKpa: 20 })
    expect(low.status).toBe(400)
    expect(low.body.message).toBe('Please check the form — The barometric pressure must be between 50 and 110 kPa. Correct it and try again.')
    expect((await clients.tuner.get<Detail>(`/api/logs/${tunerLog}`)).body.conditions).toEqual(before.body.conditions)
  })

  it('refuses a pull edit outside the log and changes nothing', async () => {
    const before = await clients.tuner.get(`/api/logs/${tunerLog}/analysis`)
    const reply = await clients.tuner.patch<{ message: string }>(`/api/logs/${tunerLog}`, { pullEdits: { remove: [99] } })
    expect(reply.status).toBe(422)
    // Counted as the report counts its pulls (from 1), not as the request does.
    expect(reply.body.message).toBe('Remove pull: there is no pull 100; the full-load rule found pulls 1 to 6 in this log. Reload the report and choose a pull from its table.')
    expect((await clients.tuner.get(`/api/logs/${tunerLog}/analysis`)).body).toEqual(before.body)
  })

  it('refuses pull changes from the customer (403, nothing changed) but takes their conditions', async () => {
    const before = await clients.tuner.get<Analysis>(`/api/logs/${tunerLog}/analysis`)
    const detailBefore = await clients.driver.get<Detail>(`/api/logs/${tunerLog}`)
    for (const pullEdits of [{ remove: [0] }, { rule: { thresholdPct: 50 } }, { keepLeftOut: true }, {}]) {
      const reply = await clients.driver.patch<{ message: string }>(`/api/logs/${tunerLog}`, { ambientTempC: 12, pullEdits })
      expect(reply.status).toBe(403)
      expect(reply.body.message).toBe('Your workshop decides which stretches of a log count as pulls. You can change the notes and the conditions (ambient temperature, altitude, barometric pressure, relative humidity).')
    }
    // Nothing half-written: neither the conditions sent alongside nor the pulls.
    expect((await clients.driver.get<Detail>(`/api/logs/${tunerLog}`)).body.conditions).toEqual(detailBefore.body.conditions)
    expect((await clients.tuner.get<Analysis>(`/api/logs/${tunerLog}/analysis`)).body).toEqual(before.body)

    const conditions = await clients.driver.patch<Detail>(`/api/logs/${tunerLog}`, { ambientTempC: 31, humidityPct: 40 })
    expect(conditions.status).toBe(200)
    expect(conditions.body.conditions).toMatchObject({ ambientTempC: 31, humidityPct: 40 })
    expect((await clients.tuner.get<Analysis>(`/api/logs/${tunerLog}/analysis`)).body.summary.pullCount).toBe(before.body.summary.pullCount)
  })
})

describe('shared links', () => {
  it('shows the report without sign-in until the link is withdrawn', async () => {
    const created = await clients.tuner.post<{ id: number, url: string }>(`/api/logs/${tunerLog}/share`, { emailDriver: true })
    expect(created.status).toBe(201)
    const token = created.body.url.split('/shared/')[1]!
    const shared = await new Client().get<{ vehicleDescription: string, analysis: Analysis, log: Record<string, unknown> }>(`/api/shared/${token}`)
    expect(shared.status).toBe(200)
    expect(shared.body.analysis.summary.pullCount).toBeGreaterThan(0)
    expect(shared.body.log).not.toHaveProperty('mapping')
    expect((await new Client().get(`/api/shared/${token}/series?channels=chargeTemp&points=20`)).status).toBe(200)
    const whatIf = await new Client().get<{ pulls: unknown[] }>(`/api/shared/${token}/what-if?ambientC=35`)
    expect(whatIf.status).toBe(200)
    expect(whatIf.body.pulls.length).toBe(shared.body.analysis.summary.pullCount)
    const mailed = readDatabase(db => db.prepare('select to_email from outbox where kind = \'report-share\' order by id desc limit 1').get() as { to_email: string })
    expect(mailed.to_email).toBe('driver@kestrel.test')

    expect((await clients.foreignOwner.delete(`/api/share-links/${created.body.id}`)).status).toBe(404)
    expect((await clients.tuner.delete(`/api/share-links/${created.body.id}`)).status).toBe(204)
    expect((await new Client().get(`/api/shared/${token}`)).status).toBe(404)
    expect((await new Client().get(`/api/shared/${token}/what-if?ambientC=35`)).status).toBe(404)
  })

  it('is for the tuner and the owner only', async () => {
    expect((await clients.driver.post(`/api/logs/${tunerLog}/share`, {})).status).toBe(403)
    expect((await clients.fabricator.post(`/api/logs/${tunerLog}/share`, {})).status).toBe(403)
    expect((await new Client().get(`/api/shared/${'x'.repeat(43)}`)).status).toBe(404)
  })
})

describe('log profiles and detection', () => {
  it('offers a saved profile when a file with the same columns comes again', async () => {
    const sample = demo.csv.slice(0, 20_000)
    const first = await clients.tuner.detect<{ headerSignature: string, profile: unknown, mapping: Record<string, { column: string, unit: string }> }>(sample, 'a.csv')
    expect(first.status).toBe(200)
    expect(first.body.mapping.chargeTemp!.column).toBe('Charge air temp (°C)')
    const name = `Track logger ${Date.now()}`
    const saved = await clients.tuner.post<{ id: number }>('/api/log-profiles', { name, headerSignature: first.body.headerSignature, mapping: { chargeTemp: { column: 'Charge air temp (°C)', unit: 'degC' } } })
    expect(saved.status).toBe(201)
    const again = await clients.driver.detect<{ profile: { id: number, name: string } | null }>(sample, 'b.csv')
    expect(again.body.profile).toMatchObject({ id: saved.body.id, name })
    const foreign = await clients.foreignOwner.detect<{ profile: unknown }>(sample, 'c.csv')
    expect(foreign.body.profile).toBeNull()
    expect((await clients.driver.post('/api/log-profiles', { name: 'mine', headerSignature: 'abc', mapping: {} })).status).toBe(403)
    expect((await clients.foreignOwner.delete(`/api/log-profiles/${saved.body.id}`)).status).toBe(404)
    expect((await clients.tuner.delete(`/api/log-profiles/${saved.body.id}`)).status).toBe(204)
  })

  it('answers a sample that is not a log with a message', async () => {
    const reply = await clients.tuner.detect<{ message: string }>('\n\n', 'blank.csv')
    expect(reply.status).toBe(422)
    expect(reply.body.message).toBe('The file is empty (only blank lines). Upload the CSV export of the log itself.')
  })

  it('answers an empty sample, or one sent as JSON text, with what to send', async () => {
    const empty = await clients.tuner.detect<{ message: string }>(new Uint8Array(0), 'empty.csv')
    expect(empty.status).toBe(400)
    expect(empty.body.message).toMatch(/empty/)
    const json = await clients.tuner.post<{ message: string }>('/api/logs/detect', { sample: demo.csv.slice(0, 2000), fileName: 'a.csv' })
    expect(json.status).toBe(415)
    expect(json.body.message).toMatch(/application\/octet-stream/)
  })

  // The demo log as an older Windows program (one byte 0xB0 for °) or a UTF-16 logger writes it.
  const header = demo.csv.slice(0, demo.csv.indexOf('\n'))
  const encodings: Array<[string, (text: string) => Uint8Array]> = [
    ['UTF-16 LE with a byte-order mark', text => new Uint8Array([0xFF, 0xFE, ...Buffer.from(text, 'utf16le')])],
    ['Windows-1252', text => new Uint8Array(Buffer.from(text, 'latin1'))],
  ]

  it.each(encodings)('reads a %s sample with the same clean headers as the import', async (_label, encode) => {
    const bytes = encode(demo.csv)
    // The page sends the first bytes of the file, cut wherever the limit falls.
    const detected = await clients.tuner.detect<{ columns: Array<{ header: string }>, mapping: Record<string, { column: string }> }>(bytes.subarray(0, 4001), 'old-logger.csv')
    expect(detected.status).toBe(200)
    expect(header).toContain('Charge air temp (°C)')
    expect(detected.body.columns.map(c => c.header)).toEqual(header.split(','))
    expect(detected.body.mapping.chargeTemp!.column).toBe('Charge air temp (°C)')

    const uploaded = await clients.tuner.upload<{ id: number, mapping: Record<string, { column: string }> }>('/api/logs', { vehicleId: ids.driverCar }, { name: 'old-logger.csv', content: bytes })
    expect(uploaded.status).toBe(201)
    for (const [channel, entry] of Object.entries(detected.body.mapping)) {
      if (entry.column) expect(uploaded.body.mapping[channel]?.column, channel).toBe(entry.column)
    }
  })
})

describe('DELETE /api/logs/:id', () => {
  it.each([
    ['anonymous', 401], ['fabricator', 403], ['driver', 403], ['driver2', 404], ['foreignOwner', 404], ['owner', 204],
  ] as const)('%s → %i, and a deleted log leaves no file', async (who, status) => {
    const created = await clients.tuner.upload<Detail>('/api/logs', { vehicleId: ids.driverCar }, demoFile)
    const before = logFootprint()
    expect((await clients[who].delete(`/api/logs/${created.body.id}`)).status).toBe(status)
    const after = logFootprint()
    expect(after).toEqual(status === 204 ? { logs: before.logs - 1, analyses: before.analyses - 1, files: before.files - 1 } : before)
  })
})
