import type { Db } from './db'

export interface OutgoingMail {
  workshopId: number | null
  to: string
  subject: string
  text: string
  kind: 'invite' | 'password-reset' | 'report-share' | 'quote'
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
  }).returning({ id: tables.outbox.id }).get()
}
