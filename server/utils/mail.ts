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
  kind: 'invite' | 'password-reset' | 'report-share' | 'comparison-share' | 'quote' | 'payment'
  attachments?: MailAttachment[]
}

// Every e-mail is written to the outbox first (inside the caller's transaction); delivery is a
// separate step, so a failed SMTP server never loses a message or half-writes an action.
export function queueMail(db: Pick<Db, 'insert'>, mail: OutgoingMail) {
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
