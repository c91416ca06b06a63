import { and, eq, inArray, type SQL } from 'drizzle-orm'
import type { Actor } from '#shared/utils/abilities'

// Which outbox rows an actor may see: their workshop's, of the kinds their role may read.
export function visibleOutbox(actor: Actor): SQL {
  const kinds = visibleMailKinds(actor)
  const scope = eq(tables.outbox.workshopId, actor.workshopId)
  return kinds === 'all' ? scope : and(scope, inArray(tables.outbox.kind, [...kinds]))!
}

export function requireOutboxReader(actor: Actor) {
  if (!canViewOutbox(actor)) forbidden('Only the workshop owner (and the fabricator, for quote e-mails) can open the outbox.')
}

// The outbox as people read it: no message text (it may hold a sign-in link), no attachment bytes.
export function outboxEntry(row: typeof tables.outbox.$inferSelect) {
  return {
    id: row.id,
    to: row.toEmail,
    subject: row.subject,
    kind: row.kind,
    status: row.status,
    error: row.error,
    attempts: row.attempts,
    nextAttemptAt: row.status === 'queued' ? row.nextAttemptAt : null,
    messageId: row.messageId,
    createdAt: row.createdAt,
    sentAt: row.sentAt,
    attachments: row.attachments.map(attachment => ({
      filename: String(attachment.filename ?? ''),
      contentType: String(attachment.contentType ?? ''),
      size: typeof attachment.size === 'number' ? attachment.size : null,
      // Listed as received by the local mail sink (not only as queued).
      arrived: attachment.arrived === true,
    })),
  }
}
