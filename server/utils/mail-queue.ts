import { randomUUID } from 'node:crypto'
import { and, eq, isNull, lte, or, sql } from 'drizzle-orm'
import type { BetterSQLite3Database } from 'drizzle-orm/better-sqlite3'
import * as schema from '../../db/schema'
import { nextAfterFailure, type AfterFailure } from './mail-schedule'

// The outbox's state changes, one small function each, on any Drizzle handle to the schema (the
// app's own, or an in-memory database in the unit tests). Explicit imports on purpose: the unit
// tests load this file without Nitro.

type MailDb = BetterSQLite3Database<typeof schema>
export type OutboxRow = typeof schema.outbox.$inferSelect

const { outbox } = schema

// How long a claimed message is left alone. A send that outlives it (the process died mid-send)
// is tried again: at worst twice, never lost. It is longer than the transport's own time-outs.
export const MAIL_CLAIM_MS = 2 * 60_000

const isDue = (now: Date) => and(eq(outbox.status, 'queued'), or(isNull(outbox.nextAttemptAt), lte(outbox.nextAttemptAt, now)))

// Take the oldest message that is due, in one UPDATE … RETURNING: counting the try and pushing its
// next-attempt time past the claim window happen in the same statement that picks it, so two loops
// (a nudge and the sweep, or two processes on one file) can never both send it. The Message-ID is
// fixed at the first claim and kept for every retry, so a receiver sees one message, tried again.
export function claimNextDueMail(db: MailDb, now: Date, messageIdDomain: string, claimMs = MAIL_CLAIM_MS): OutboxRow | undefined {
  const oldestDue = db.select({ id: outbox.id }).from(outbox).where(isDue(now)).orderBy(outbox.id).limit(1)
  return db.update(outbox)
    .set({
      attempts: sql`${outbox.attempts} + 1`,
      nextAttemptAt: new Date(now.getTime() + claimMs),
      messageId: sql`coalesce(${outbox.messageId}, ${`<${randomUUID()}@${messageIdDomain}>`})`,
    })
    .where(and(eq(outbox.id, sql`(${oldestDue})`), isDue(now)))
    .returning()
    .get()
}

export function markMailSent(db: MailDb, id: number, now: Date) {
  db.update(outbox).set({ status: 'sent', sentAt: now, nextAttemptAt: null, error: null }).where(eq(outbox.id, id)).run()
}

// A failed try: queued again after the schedule's delay, or failed for good after the last one.
// The error is kept either way, so the outbox says why a message is still waiting.
export function markMailAttemptFailed(db: MailDb, row: Pick<OutboxRow, 'id' | 'attempts'>, error: string, delaysMs: readonly number[], now: Date): AfterFailure {
  const next = nextAfterFailure(row.attempts, delaysMs, now)
  db.update(outbox).set({ status: next.status, nextAttemptAt: next.nextAttemptAt, error }).where(eq(outbox.id, row.id)).run()
  return next
}

// "Try again" on a failed message: a fresh set of tries from now. Only a failed message moves, so
// a double click or a message sent meanwhile cannot be sent twice. Returns whether it moved.
export function requeueFailedMail(db: Pick<MailDb, 'update'>, id: number): boolean {
  const moved = db.update(outbox)
    .set({ status: 'queued', attempts: 0, nextAttemptAt: null, error: null })
    .where(and(eq(outbox.id, id), eq(outbox.status, 'failed')))
    .returning({ id: outbox.id })
    .all()
  return moved.length === 1
}

export interface ArrivedAttachment {
  filename: string
  contentType: string
  size: number
  contentBase64: string
}

// The local mail sink received a message: its attachments as they arrived (parsed from the
// message itself) replace the queued list, so the outbox shows what really came through.
export function recordArrivedMail(db: MailDb, messageId: string, attachments: ArrivedAttachment[]): boolean {
  const updated = db.update(outbox).set({ attachments: attachments.map(a => ({ ...a, arrived: true })) }).where(eq(outbox.messageId, messageId)).returning({ id: outbox.id }).all()
  return updated.length > 0
}
