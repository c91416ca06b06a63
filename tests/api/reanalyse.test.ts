import { rmSync } from 'node:fs'
import { join } from 'node:path'
import Database from 'better-sqlite3'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { generateDemoLog } from '../../server/analysis'
import { readDatabase, signIn, useTestServer, type Client } from './client'

await useTestServer()

// A stored analysis from an older engine is analysed again from the stored file when read, and the
// fresh result is stored back — never served as if today's engine had written it.

interface Analysis { summary: { pullCount: number }, pulls: Array<{ index: number, meanChargeTempC: number }> }
interface Row { engine_version: string, result: string }

let tuner: Client
let carId = 0

function writeDatabase(fn: (db: Database.Database) => void) {
  const db = new Database(join(inject('dataDir'), 'densitas.sqlite'))
  try {
    fn(db)
  }
  finally {
    db.close()
  }
}

const analysisRow = (logId: number) => readDatabase(db => db.prepare('select engine_version, result from analyses where log_id = ?').get(logId) as Row)

// Turn a log's stored analysis into one "from an older engine": an old version and a result no
// current engine would write (a made-up pull count, no pulls).
function makeStale(logId: number) {
  writeDatabase((db) => {
    const doctored = { ...JSON.parse(analysisRow(logId).result), summary: { pullCount: 99 }, pulls: [] }
    db.prepare('update analyses set engine_version = ?, result = ? where log_id = ?').run('0-old', JSON.stringify(doctored), logId)
  })
}

async function uploadDemo() {
  const reply = await tuner.upload<{ id: number }>('/api/logs', { vehicleId: carId }, { name: 'hot-day.csv', content: generateDemoLog('stock-core-hot-day').csv })
  expect(reply.status).toBe(201)
  return reply.body.id
}

beforeAll(async () => {
  tuner = await signIn('tuner@kestrel.test')
  carId = readDatabase(db => (db.prepare('select v.id from vehicles v join users u on u.id = v.owner_id where u.email = ?').get('driver@kestrel.test') as { id: number }).id)
})

describe('a stored analysis from an older engine version', () => {
  it('is analysed again from the stored file when read, and the fresh result is stored back', async () => {
    const logId = await uploadDemo()
    const fresh = await tuner.get<Analysis>(`/api/logs/${logId}/analysis`)
    const currentVersion = analysisRow(logId).engine_version
    expect(fresh.body.summary.pullCount).toBe(6)

    makeStale(logId)
    expect(analysisRow(logId).engine_version).toBe('0-old')

    const reread = await tuner.get<Analysis>(`/api/logs/${logId}/analysis`)
    expect(reread.status).toBe(200)
    // The doctored result is not served: the same file analysed again gives the same pulls and
    // summary. (The mapping part differs on purpose: the stored mapping is replayed as given.)
    expect(reread.body.pulls).toEqual(fresh.body.pulls)
    expect(reread.body.summary).toEqual(fresh.body.summary)
    const stored = analysisRow(logId)
    expect(stored.engine_version).toBe(currentVersion)
    expect(JSON.parse(stored.result)).toEqual(reread.body)
    const audit = readDatabase(db => db.prepare('select action, detail from audit_events where entity = \'log\' and entity_id = ? and action = \'reanalysed\'').all(logId) as Array<{ detail: string }>)
    expect(audit).toHaveLength(1)
    expect(JSON.parse(audit[0]!.detail)).toEqual({ reason: 'engine version', from: '0-old', to: currentVersion })
  })

  it('reaches the shared report and the pull export too', async () => {
    const logId = await uploadDemo()
    const share = await tuner.post<{ url: string }>(`/api/logs/${logId}/share`, {})
    expect(share.status).toBe(201)
    makeStale(logId)
    const shared = await tuner.get<{ analysis: Analysis }>(`/api/shared/${share.body.url.split('/shared/')[1]}`)
    expect(shared.body.analysis.summary.pullCount).toBe(6)
    makeStale(logId)
    const csv = await tuner.get<string>(`/api/logs/${logId}/export.csv`)
    expect(csv.status).toBe(200)
    expect(csv.body.split('\r\n').filter(line => /^\d+,/.test(line))).toHaveLength(6)
  })

  it('answers 409 with what to do when the stored file is gone, and leaves the row as it was', async () => {
    const logId = await uploadDemo()
    makeStale(logId)
    rmSync(join(inject('dataDir'), 'uploads', 'logs', String(logId)))
    const reply = await tuner.get<{ message: string }>(`/api/logs/${logId}/analysis`)
    expect(reply.status).toBe(409)
    expect(reply.body.message).toBe('This log was analysed by an older version of Densitas and its file is no longer stored, so it cannot be analysed again. Upload the log again.')
    expect(analysisRow(logId).engine_version).toBe('0-old')
  })
})
