// The outbox's words, shared by the server (what it stores and answers) and the pages (what they say).

export const MAIL_KINDS = ['invite', 'password-reset', 'report-share', 'comparison-share', 'quote', 'payment'] as const
export type MailKind = typeof MAIL_KINDS[number]

export const MAIL_KIND_LABELS: Record<MailKind, string> = {
  'invite': 'Invitation',
  'password-reset': 'Password reset',
  'report-share': 'Shared report',
  'comparison-share': 'Shared comparison',
  'quote': 'Quote',
  'payment': 'Deposit paid',
}

export const mailKindLabel = (kind: string) => MAIL_KIND_LABELS[kind as MailKind] ?? kind

// What a screen can honestly say right after it asked for an e-mail: handed to the mail server
// ("sent"), still waiting for a (next) try ("queued"), or given up after the last try ("failed").
export interface MailDelivery {
  to: string
  status: 'queued' | 'sent' | 'failed'
  error: string | null
}

export const OUTBOX_STATUS_LABELS: Record<MailDelivery['status'], string> = {
  queued: 'Waiting to be sent',
  sent: 'Sent',
  failed: 'Not sent',
}

// One sentence for the confirmation a screen shows; `what` names the message ("The invitation").
export function deliverySentence(what: string, delivery: MailDelivery): string {
  if (delivery.status === 'sent') return `${what} was e-mailed to ${delivery.to}.`
  if (delivery.status === 'failed') return `${what} could not be e-mailed to ${delivery.to}: ${delivery.error ?? 'the mail server refused it'}.`
  return `${what} to ${delivery.to} is queued, not sent yet: the mail server has not taken it so far. Densitas keeps trying for a while.`
}

// "2 Dec 2026, 08:41": the outbox needs the time of day, not only the date.
export function formatMailTime(value: string | number | Date | null | undefined) {
  if (value == null) return '—'
  return new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' }).format(new Date(value))
}

// Decimal units, as a mail program shows an attachment's size.
export function formatAttachmentSize(bytes: number | null | undefined) {
  if (bytes == null || !Number.isFinite(bytes)) return 'size unknown'
  if (bytes < 1000) return `${bytes} B`
  if (bytes < 1_000_000) return `${(bytes / 1000).toFixed(1)} kB`
  return `${(bytes / 1_000_000).toFixed(1)} MB`
}

export const OUTBOX_PAGE_SIZE = 25

// Fixed keys the outbox can be sorted by; the server maps each to its column ("queued" is the order
// the messages were made in, newest first by default).
export const OUTBOX_SORT_KEYS = ['queued', 'to', 'subject', 'kind', 'status', 'attempts', 'sent'] as const
export type OutboxSortKey = typeof OUTBOX_SORT_KEYS[number]
