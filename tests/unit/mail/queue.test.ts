import { resolve } from 'node:path'
import Database from 'better-sqlite3'
import { eq } from 'drizzle-orm'
import { drizzle } from 'drizzle-orm/better-sqlite3'
import { migrate } from 'drizzle-orm/better-sqlite3/migrator'
import { beforeEach, describe, expect, it } from 'vitest'
import * as schema from '../../../db/schema'
import { claimNextDueMail, markMailAttemptFailed, markMailSent, recordArrivedMail, requeueFailedMail } from '../../../server/utils/mail-queue'

// The outbox's state changes against a real SQLite database in memory, migrated like the app's.
const migrationsFolder = resolve(import.meta.dirname, '..', '..', '..', 'db', 'migrations')
const DOMAIN = 'densitas.invalid'
const t0 = new Date('2026-12-02T08:00:00Z')
const at = (ms: number) => new Date(t0.getTime() + ms)

let db: ReturnType<typeof drizzle<typeof schema>>

function queue(to: string, extra: Partial<typeof schema.outbox.$inferInsert> = {}) {
  return db.insert(schema.outbox).values({ toEmail: to, subject: 'Hello', text: 'Body', kind: 'invite', workshopId: null, ...extra }).returning().get()
}
const read = (id: number) => db.select().from(schema.outbox).where(eq(schema.outbox.id, id)).get()!

beforeEach(() => {
  db = drizzle(new Database(':memory:'), { schema })
  migrate(db, { migrationsFolder })
})

describe('claiming a message to send', () => {
  it('takes the oldest due message, counts the try and gives it a Message-ID', () => {
    const first = queue('a@example.test')
    queue('b@example.test')
    const claimed = claimNextDueMail(db, t0, DOMAIN)!
    expect(claimed.id).toBe(first.id)
    expect(claimed.attempts).toBe(1)
    expect(claimed.messageId).toMatch(/^<[0-9a-f-]{36}@densitas\.invalid>$/)
    expect(claimed.status).toBe('queued')
    // Held for the claim window, so nothing else picks it while it is being sent.
    expect(claimed.nextAttemptAt!.getTime()).toBeGreaterThan(t0.getTime())
  })

  it('never hands the same message out twice while it is held', () => {
    queue('a@example.test')
    queue('b@example.test')
    const first = claimNextDueMail(db, t0, DOMAIN)!
    const second = claimNextDueMail(db, t0, DOMAIN)!
    expect(second.id).not.toBe(first.id)
    expect(claimNextDueMail(db, t0, DOMAIN)).toBeUndefined()
  })

  it('hands a held message out again once the claim window has passed (the sender died mid-send)', () => {
    const row = queue('a@example.test')
    const first = claimNextDueMail(db, t0, DOMAIN, 60_000)!
    expect(claimNextDueMail(db, at(59_000), DOMAIN, 60_000)).toBeUndefined()
    const again = claimNextDueMail(db, at(60_000), DOMAIN, 60_000)!
    expect(again.id).toBe(row.id)
    expect(again.attempts).toBe(2)
    expect(again.messageId).toBe(first.messageId)
  })

  it('leaves sent and failed messages alone, and waits for a retry\'s time', () => {
    queue('sent@example.test', { status: 'sent' })
    queue('failed@example.test', { status: 'failed' })
    const later = queue('later@example.test', { nextAttemptAt: at(10_000) })
    expect(claimNextDueMail(db, t0, DOMAIN)).toBeUndefined()
    expect(claimNextDueMail(db, at(10_000), DOMAIN)?.id).toBe(later.id)
  })
})

describe('after a try', () => {
  it('marks a message sent with the time and clears the last error', () => {
    const row = queue('a@example.test', { error: 'earlier failure' })
    claimNextDueMail(db, t0, DOMAIN)
    markMailSent(db, row.id, at(500))
    expect(read(row.id)).toMatchObject({ status: 'sent', sentAt: at(500), error: null, nextAttemptAt: null, attempts: 1 })
    expect(claimNextDueMail(db, at(999_999), DOMAIN)).toBeUndefined()
  })

  it('queues a failed try again after the schedule\'s delay, keeping the error', () => {
    const row = queue('a@example.test')
    const claimed = claimNextDueMail(db, t0, DOMAIN)!
    const next = markMailAttemptFailed(db, claimed, 'connect ECONNREFUSED', [10_000, 60_000], t0)
    expect(next).toEqual({ status: 'queued', nextAttemptAt: at(10_000) })
    expect(read(row.id)).toMatchObject({ status: 'queued', error: 'connect ECONNREFUSED', attempts: 1, nextAttemptAt: at(10_000) })
    expect(claimNextDueMail(db, at(9_999), DOMAIN)).toBeUndefined()
  })

  it('fails a message for good after the last try, and nothing is lost', () => {
    const row = queue('a@example.test')
    const delays = [1000, 2000]
    let now = t0
    for (let attempt = 1; attempt <= 3; attempt++) {
      const claimed = claimNextDueMail(db, now, DOMAIN)!
      expect(claimed.attempts).toBe(attempt)
      const next = markMailAttemptFailed(db, claimed, `refused ${attempt}`, delays, now)
      if (next.status === 'queued') now = next.nextAttemptAt
    }
    expect(read(row.id)).toMatchObject({ status: 'failed', attempts: 3, error: 'refused 3', nextAttemptAt: null, text: 'Body' })
    expect(claimNextDueMail(db, at(86_400_000), DOMAIN)).toBeUndefined()
  })
})

describe('trying a failed message again', () => {
  it('gives it a fresh set of tries, once', () => {
    const row = queue('a@example.test', { status: 'failed', attempts: 5, error: 'refused' })
    expect(requeueFailedMail(db, row.id)).toBe(true)
    expect(read(row.id)).toMatchObject({ status: 'queued', attempts: 0, error: null, nextAttemptAt: null })
    // A second click finds nothing failed to move.
    expect(requeueFailedMail(db, row.id)).toBe(false)
    expect(claimNextDueMail(db, t0, DOMAIN)?.id).toBe(row.id)
  })

  it('does not touch a sent or queued message', () => {
    const sent = queue('a@example.test', { status: 'sent' })
    const queued = queue('b@example.test')
    expect(requeueFailedMail(db, sent.id)).toBe(false)
    expect(requeueFailedMail(db, queued.id)).toBe(false)
    expect(read(sent.id).status).toBe('sent')
  })
})

describe('what the local mail sink received', () => {
  it('replaces the queued attachment list with the one that arrived, matched by Message-ID', () => {
    const row = queue('a@example.test', { attachments: [{ filename: 'Q-2026-0001.pdf', contentType: 'application/pdf', size: 3, contentBase64: 'JVBE' }] })
    const claimed = claimNextDueMail(db, t0, DOMAIN)!
    expect(recordArrivedMail(db, claimed.messageId!, [{ filename: 'Q-2026-0001.pdf', contentType: 'application/pdf', size: 3, contentBase64: 'JVBE' }])).toBe(true)
    expect(read(row.id).attachments).toEqual([{ filename: 'Q-2026-0001.pdf', contentType: 'application/pdf', size: 3, contentBase64: 'JVBE', arrived: true }])
    expect(recordArrivedMail(db, '<unknown@densitas.invalid>', [])).toBe(false)
  })
})
