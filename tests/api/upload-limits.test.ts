import { existsSync, readdirSync } from 'node:fs'
import { join } from 'node:path'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { generateDemoLog } from '../../server/analysis'
import type { Client } from './client'
import { logFootprint, readDatabase, signIn, useTestServer } from './client'
import { streamUpload } from './stream-upload'

await useTestServer()

const baseUrl = inject('baseUrl')
const demo = generateDemoLog('stock-core-hot-day')
const demoFile = { name: 'hot-day.csv', content: demo.csv }
const MB = 1024 * 1024

let tuner: Client
let carId = 0

interface Detail { id: number, originalName: string, recordedOn: string | null }

// Everything the uploads folder holds: stored logs and any temporary file left behind.
function uploadsFootprint() {
  const root = join(inject('dataDir'), 'uploads')
  const walk = (dir: string): string[] => existsSync(dir)
    ? readdirSync(dir, { withFileTypes: true }).flatMap(entry => entry.isDirectory() ? walk(join(dir, entry.name)) : [join(dir, entry.name)])
    : []
  return { ...logFootprint(), all: walk(root).length }
}

// The server may still be removing a temporary file when a connection it closed reaches the client.
async function settledFootprint(expected: ReturnType<typeof uploadsFootprint>) {
  const deadline = Date.now() + 3000
  while (Date.now() < deadline && JSON.stringify(uploadsFootprint()) !== JSON.stringify(expected)) await new Promise(r => setTimeout(r, 100))
  return uploadsFootprint()
}

async function healthy() {
  const response = await fetch(`${baseUrl}/api/health`)
  return response.status
}

beforeAll(async () => {
  tuner = await signIn('tuner@kestrel.test')
  carId = readDatabase(db => (db.prepare('select v.id from vehicles v join users u on u.id = v.owner_id where u.email = ? order by v.id limit 1').get('driver@kestrel.test') as { id: number }).id)
})

describe('an upload over the size limit, whatever the headers say', () => {
  it('answers a chunked 60 MB upload with 413 once 50 MB are read, and keeps nothing', async () => {
    const before = uploadsFootprint()
    const result = await streamUpload({ baseUrl, cookie: tuner.cookie, fields: { vehicleId: carId }, fileName: 'long.csv', fileBytes: 60 * MB })
    expect(result.status, result.error).toBe(413)
    expect(JSON.parse(result.body).message).toMatch(/larger than 50 MB/)
    expect(uploadsFootprint()).toEqual(before)
    expect(await healthy()).toBe(200)
  }, 60_000)

  it('stops reading a chunked 150 MB stream instead of taking it all in, and stays up', async () => {
    const before = uploadsFootprint()
    const result = await streamUpload({ baseUrl, cookie: tuner.cookie, fields: { vehicleId: carId }, fileName: 'endless.csv', fileBytes: 150 * MB })
    expect(result.status, result.error).toBe(413)
    // The answer came while the client was still sending: the server did not wait for the rest.
    expect(result.sentBeforeAnswer).toBeLessThan(100 * MB)
    expect(uploadsFootprint()).toEqual(before)
    expect(await healthy()).toBe(200)
  }, 90_000)

  it('reads no further than a Content-Length that is smaller than the body, and stores nothing', async () => {
    const before = uploadsFootprint()
    const result = await streamUpload({ baseUrl, cookie: tuner.cookie, fields: { vehicleId: carId }, fileName: 'liar.csv', fileBytes: 60 * MB, contentLength: 64 * 1024 })
    // The server answers 4xx for the cut-off form; the bytes past the declared length are not a
    // request, so it may close the connection before the client reads that answer (status 0).
    expect(result.status === 0 || (result.status >= 400 && result.status < 500), `${result.status} ${result.error}`).toBe(true)
    expect(await settledFootprint(before)).toEqual(before)
    expect(await healthy()).toBe(200)
  }, 60_000)
})

describe('POST /api/logs/detect', () => {
  it('refuses a sample over 512 KB with a 413 that says how much to send', async () => {
    const reply = await tuner.detect<{ message: string }>(demo.csv.slice(0, 1000).padEnd(530_000, '1'), 'a.csv')
    expect(reply.status).toBe(413)
    expect(reply.body.message).toMatch(/first 512 KB/)
    const limit = new Uint8Array(512 * 1024).fill(0x31)
    limit.set(new TextEncoder().encode(demo.csv.slice(0, 1000)))
    const atTheLimit = await tuner.detect(limit, 'a.csv')
    expect(atTheLimit.status).toBe(200)
  })

  it('does not turn a sample with thousands of columns into an answer many times its size', async () => {
    const columns = 40_000
    const sample = `Time (s),${Array.from({ length: columns }, (_, i) => `c${i}`).join(',')}\n0,${Array(columns).fill('1').join(',')}\n`.slice(0, 500_000)
    const response = await fetch(`${baseUrl}/api/logs/detect?fileName=wide.csv`, { method: 'POST', headers: { 'content-type': 'application/octet-stream', 'cookie': tuner.cookie, 'origin': baseUrl }, body: sample })
    const text = await response.text()
    expect(text.length).toBeLessThan(300_000)
    expect(response.status).toBe(422)
    expect(JSON.parse(text).message).toMatch(/columns/)
  })

  it('trims long cells in the preview', async () => {
    const sample = `Time (s),Charge air temp (°C),Ambient temp (°C)\n${Array.from({ length: 30 }, (_, i) => `${i},${'4'.repeat(15_000)},30`).join('\n')}\n`
    const response = await fetch(`${baseUrl}/api/logs/detect?fileName=long-cells.csv`, { method: 'POST', headers: { 'content-type': 'application/octet-stream', 'cookie': tuner.cookie, 'origin': baseUrl }, body: sample })
    const text = await response.text()
    expect(response.status).toBe(200)
    expect(text.length).toBeLessThan(50_000)
    const body = JSON.parse(text) as { rows: string[][], columns: Array<{ samples: string[] }> }
    expect(body.rows.length).toBeGreaterThan(0)
    expect(body.rows.flat().every(cell => cell.length <= 40)).toBe(true)
    expect(body.columns.flatMap(c => c.samples).every(cell => cell.length <= 40)).toBe(true)
  })
})

describe('the day of the pulls', () => {
  const day = (offsetDays: number) => new Date(Date.now() + offsetDays * 86_400_000).toISOString().slice(0, 10)

  it.each([
    ['9999-99-99'], ['2026-02-30'], ['2026-13-01'], ['1989-12-31'], [day(3)],
  ])('refuses %s with a message and stores nothing', async (recordedOn) => {
    const before = uploadsFootprint()
    const reply = await tuner.upload<{ message: string }>('/api/logs', { vehicleId: carId, recordedOn }, demoFile)
    expect(reply.status).toBe(400)
    expect(reply.body.message).toMatch(/day of the pulls/)
    expect(uploadsFootprint()).toEqual(before)
  })

  it('takes today and a day in 1990', async () => {
    for (const recordedOn of [day(0), '1990-01-01']) {
      const reply = await tuner.upload<Detail>('/api/logs', { vehicleId: carId, recordedOn }, demoFile)
      expect(reply.status).toBe(201)
      expect(reply.body.recordedOn).toBe(recordedOn)
    }
  })
})

describe('fixed values in a mapping', () => {
  it.each([
    ['a barometric pressure of 1e308 kPa', { baro: { value: 1e308, unit: 'kPa' } }, /barometric pressure/i],
    ['a barometric pressure of 30 kPa', { baro: { value: 30, unit: 'kPa' } }, /50 and 110 kPa/],
    ['an ambient temperature of 90 °C', { ambientTemp: { value: 90, unit: 'degC' } }, /−40 and 60 °C/],
    ['a humidity of 140 %', { humidity: { value: 140, unit: '%' } }, /0 and 100 %/],
  ])('refuses %s with the bounds the form uses, and stores nothing', async (_label, mapping, message) => {
    const before = uploadsFootprint()
    const reply = await tuner.upload<{ message: string }>('/api/logs', { vehicleId: carId, mapping: JSON.stringify(mapping) }, demoFile)
    expect(reply.status).toBe(422)
    expect(reply.body.message).toMatch(message)
    expect(uploadsFootprint()).toEqual(before)
  })

  it('takes a barometric pressure in range, in any pressure unit', async () => {
    const reply = await tuner.upload<Detail>('/api/logs', { vehicleId: carId, mapping: JSON.stringify({ baro: { value: 14.5, unit: 'psi' } }) }, demoFile)
    expect(reply.status).toBe(201)
  })
})

describe('names and notes that reach other programs', () => {
  it('neutralises a formula after leading spaces in the CSV export', async () => {
    const uploaded = await tuner.upload<Detail>('/api/logs', { vehicleId: carId, notes: ' =1+1' }, demoFile)
    expect(uploaded.status).toBe(201)
    const reply = await tuner.get<string>(`/api/logs/${uploaded.body.id}/export.csv`)
    expect(reply.body).toContain('Notes,\' =1+1')
    expect(reply.body).not.toMatch(/,\s+=1\+1/)
  })

  it('drops direction overrides and control characters from the stored name and the download name', async () => {
    const uploaded = await tuner.upload<Detail>('/api/logs', { vehicleId: carId }, { name: 'pulls\u202Evsc\u0085.csv', content: demo.csv })
    expect(uploaded.status).toBe(201)
    expect(uploaded.body.originalName).toBe('pullsvsc.csv')
    const download = await tuner.get(`/api/logs/${uploaded.body.id}/download`)
    const disposition = download.headers.get('content-disposition')!
    expect(disposition).toContain('pullsvsc.csv')
    expect(disposition).not.toMatch(/\u202E|%E2%80%AE|%C2%85/i)
  })

  it('keeps other letters of a name as they were typed', async () => {
    const uploaded = await tuner.upload<Detail>('/api/logs', { vehicleId: carId }, { name: 'Prüfstand Läufe.csv', content: demo.csv })
    expect(uploaded.status).toBe(201)
    expect(uploaded.body.originalName).toBe('Prüfstand Läufe.csv')
  })
})

describe('a series read while the log is deleted', () => {
  it('answers 200 or 404, never a server error', async () => {
    // A log big enough that reading it takes a moment, so reads and the delete overlap.
    const big = generateDemoLog('stock-core-hot-day', { sampleRateHz: 200, pulls: 12 })
    const uploaded = await tuner.upload<Detail>('/api/logs', { vehicleId: carId }, { name: 'race.csv', content: big.csv })
    expect(uploaded.status).toBe(201)
    const id = uploaded.body.id
    const reads = Array.from({ length: 12 }, (_, i) => new Promise<number>(resolve => setTimeout(resolve, i * 3))
      .then(() => tuner.get(`/api/logs/${id}/series?channels=chargeTemp&points=${100 + i}`))
      .then(reply => reply.status))
    const deleted = new Promise(resolve => setTimeout(resolve, 5)).then(() => tuner.delete(`/api/logs/${id}`))
    const statuses = await Promise.all(reads)
    expect((await deleted).status).toBe(204)
    expect(statuses.filter(status => status !== 200 && status !== 404)).toEqual([])
    expect(statuses).toContain(404)
  })
})
