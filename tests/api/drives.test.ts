// One file holding several joined drives (issue 10): refused with the drives listed until a drive
// choice is sent, then stored as one analysed log per chosen drive, each keeping its drive index.
import { beforeAll, describe, expect, it } from 'vitest'
import { generateDemoLog } from '../../server/analysis'
import { Client, logFootprint, readDatabase, signIn, useTestServer } from './client'

await useTestServer()

// Two invented demo drives joined: the second one's time starts again at 0 s.
const first = generateDemoLog('stock-core-hot-day').csv.trimEnd().split('\n')
const second = generateDemoLog('front-mount-after').csv.trimEnd().split('\n')
const joined = { name: 'two-drives.csv', content: [...first, ...second.slice(1)].join('\n') + '\n' }

interface DrivesError { message: string, data: { code: string, drives: Array<{ index: number, startS: number, durationS: number, rows: number, contains: string }> } }

let tuner: Client
let foreignOwner: Client
let car = 0

beforeAll(async () => {
  tuner = await signIn('tuner@kestrel.test')
  foreignOwner = await signIn('owner@harbourside.test')
  car = readDatabase(db => (db.prepare('select v.id from vehicles v join users u on u.id = v.owner_id where u.email = ? order by v.id limit 1').get('driver@kestrel.test') as { id: number }).id)
})

describe('POST /api/logs with a file of several drives', () => {
  it('answers 422 SEVERAL_DRIVES listing the drives, and stores nothing', async () => {
    const before = logFootprint()
    const reply = await tuner.upload<DrivesError>('/api/logs', { vehicleId: car }, joined)
    expect(reply.status).toBe(422)
    expect(reply.body.data.code).toBe('SEVERAL_DRIVES')
    expect(reply.body.data.drives).toHaveLength(2)
    expect(reply.body.data.drives.map(d => d.index)).toEqual([0, 1])
    expect(reply.body.data.drives.map(d => d.rows)).toEqual([first.length - 1, second.length - 1])
    for (const drive of reply.body.data.drives) {
      expect(drive.startS).toBe(0)
      expect(drive.durationS).toBeGreaterThan(300)
      expect(drive.contains).toMatch(/charge temperature/)
    }
    expect(reply.body.message).toMatch(/2 drives/)
    expect(logFootprint()).toEqual(before)
  })

  it('stores one analysed log per drive with drives=all, each keeping its drive index', async () => {
    const before = logFootprint()
    const reply = await tuner.upload<{ ids: number[] }>('/api/logs', { vehicleId: car, drives: 'all' }, joined)
    expect(reply.status).toBe(201)
    expect(reply.body.ids).toHaveLength(2)
    expect(logFootprint()).toEqual({ logs: before.logs + 2, analyses: before.analyses + 2, files: before.files + 2 })
    const rows = readDatabase(db => reply.body.ids.map(id => db.prepare('select drive_index, row_count, original_name from logs where id = ?').get(id) as { drive_index: number, row_count: number, original_name: string }))
    expect(rows.map(r => r.drive_index)).toEqual([0, 1])
    expect(rows.map(r => r.row_count)).toEqual([first.length - 1, second.length - 1])
    expect(rows.every(r => r.original_name === 'two-drives.csv')).toBe(true)
    // Each drive is its own analysis: the stock core soaks more than the front-mount.
    const [a, b] = await Promise.all(reply.body.ids.map(id => tuner.get<{ summary: { pullCount: number, meanDeltaOverAmbientK: number }, drive: { runningS: number } }>(`/api/logs/${id}/analysis`)))
    expect(a!.body.summary.pullCount).toBe(6)
    expect(b!.body.summary.pullCount).toBeGreaterThan(0)
    expect(a!.body.summary.meanDeltaOverAmbientK).toBeGreaterThan(b!.body.summary.meanDeltaOverAmbientK)
    expect(a!.body.drive.runningS).toBeGreaterThan(300)
    // Re-analysis reads the same drive of the stored file again.
    const patched = await tuner.patch(`/api/logs/${reply.body.ids[1]}`, { ambientTempC: 20 })
    expect(patched.status).toBe(200)
    const again = await tuner.get<{ summary: { pullCount: number } }>(`/api/logs/${reply.body.ids[1]}/analysis`)
    expect(again.body.summary.pullCount).toBe(b!.body.summary.pullCount)
  })

  it('stores only the chosen drive with drives=1', async () => {
    const reply = await tuner.upload<{ ids: number[] }>('/api/logs', { vehicleId: car, drives: '1' }, joined)
    expect(reply.status).toBe(201)
    expect(reply.body.ids).toHaveLength(1)
    expect(readDatabase(db => (db.prepare('select drive_index from logs where id = ?').get(reply.body.ids[0]) as { drive_index: number }).drive_index)).toBe(1)
  })

  it.each([['7', /no drive 7/], ['first', /not understood/], ['', /not understood/]])('refuses the drive choice "%s" with a message, storing nothing', async (choice, message) => {
    const before = logFootprint()
    const reply = await tuner.upload<{ message: string }>('/api/logs', { vehicleId: car, drives: choice }, joined)
    expect(reply.status).toBe(400)
    expect(reply.body.message).toMatch(message)
    expect(logFootprint()).toEqual(before)
  })

  it('keeps the role rules: anonymous 401, another workshop 404', async () => {
    const before = logFootprint()
    expect((await new Client().upload('/api/logs', { vehicleId: car, drives: 'all' }, joined)).status).toBe(401)
    expect((await foreignOwner.upload('/api/logs', { vehicleId: car, drives: 'all' }, joined)).status).toBe(404)
    expect(logFootprint()).toEqual(before)
  })

  it('stores a file of one drive whole, answering with its id', async () => {
    const reply = await tuner.upload<{ ids: number[] }>('/api/logs', { vehicleId: car, drives: 'all' }, { name: 'one.csv', content: generateDemoLog('front-mount-after').csv })
    expect(reply.status).toBe(201)
    expect(reply.body.ids).toHaveLength(1)
    expect(readDatabase(db => (db.prepare('select drive_index from logs where id = ?').get(reply.body.ids[0]) as { drive_index: number | null }).drive_index)).toBeNull()
  })
})
