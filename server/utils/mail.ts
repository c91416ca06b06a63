import type { MailKind } from '#shared/utils/outbox'
import type { Db } from './db'

export interface MailAttachment {
  filename: string
  contentType: string
  content: Uint8Array
}

export interface OutgoingMail {
  workshopId: number | null
  to: string
  subject: string
  text: string
  kind: MailKind
  attachments?: MailAttachment[]
}

// Every e-mail is written to the outbox first (inside the caller's transaction); delivery is a
// separate step, so a failed SMTP server never loses a message or half-writes an action. The
// delivery loop is nudged here and looks only after the transaction has committed (see
// deliverSoon). Callers that report to the screen pass the returned id to awaitFirstDelivery.
export function queueMail(db: Pick<Db, 'insert'>, mail: OutgoingMail) {
  deliverSoon()
  return db.insert(tables.outbox).values({
    workshopId: mail.workshopId,
    toEmail: mail.to,
    subject: mail.subject,
    text: mail.text,
    kind: mail.kind,
    attachments: (mail.attachments ?? []).map(a => ({
      filename: a.filename,
      contentType: a.contentType,
      size: a.content.byteLength,
      contentBase64: Buffer.from(a.content).toString('base64'),
    })),
  }).returning({ id: tables.outbox.id }).get()
}
