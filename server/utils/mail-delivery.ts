import { eq } from 'drizzle-orm'
import type { Transporter } from 'nodemailer'
import type { MailDelivery } from '#shared/utils/outbox'
import type { MailSettings } from './mail-config'
import { claimNextDueMail, markMailAttemptFailed, markMailSent, type OutboxRow } from './mail-queue'
import { describeSendError } from './mail-schedule'

// The delivery loop: one per server process (like the database connection), started by the mail
// plugin. It drains every due outbox message one at a time, when nudged after a message is queued
// and on a periodic sweep, which also picks up what an earlier run left behind.

interface Worker {
  transport: Transporter
  settings: MailSettings
  sweep: NodeJS.Timeout
}

let worker: Worker | undefined
let draining: Promise<void> | undefined
let drainAgain = false
const inFlight = new Set<number>()
const waiters = new Map<number, Set<() => void>>()

export function startMailDelivery(transport: Transporter, settings: MailSettings) {
  worker = { transport, settings, sweep: setInterval(() => deliverSoon(), settings.sweepMs).unref() }
  deliverSoon()
}

// Stop taking new messages, let the one being sent finish (its result is recorded), then close.
export async function stopMailDelivery() {
  const current = worker
  if (!current) return
  worker = undefined
  clearInterval(current.sweep)
  await draining
  current.transport.close()
}

// Ask the loop to look at the outbox. Called by queueMail inside the caller's transaction: the
// timer fires only after the synchronous better-sqlite3 transaction has committed (or rolled back,
// and then there is nothing to send).
export function deliverSoon(delayMs = 0) {
  if (!worker) return
  setTimeout(() => void drain(), Math.max(0, delayMs)).unref()
}

function drain(): Promise<void> {
  if (draining) {
    drainAgain = true
    return draining
  }
  draining = (async () => {
    do {
      drainAgain = false
      for (let current = worker; current; current = worker) {
        const row = claimNextDueMail(useDb(), new Date(), current.settings.messageIdDomain)
        if (!row) break
        await sendClaimed(current, row)
      }
    } while (drainAgain && worker)
  })()
    .catch(error => console.error('E-mail delivery stopped on an error; the next sweep tries again.', error))
    .finally(() => {
      draining = undefined
    })
  return draining
}

async function sendClaimed(current: Worker, row: OutboxRow) {
  inFlight.add(row.id)
  try {
    let failure: string | null = null
    try {
      await current.transport.sendMail({
        from: current.settings.from,
        to: row.toEmail,
        subject: row.subject,
        text: row.text,
        messageId: row.messageId ?? undefined,
        attachments: storedAttachments(row.attachments),
      })
    }
    catch (error) {
      failure = describeSendError(error)
    }
    // Recorded outside the send's try: a database hiccup after a good send must not count as a
    // failed send, or the message would go out twice.
    if (failure === null) {
      markMailSent(useDb(), row.id, new Date())
    }
    else {
      const next = markMailAttemptFailed(useDb(), row, failure, current.settings.retryDelaysMs, new Date())
      if (next.status === 'queued') deliverSoon(next.nextAttemptAt.getTime() - Date.now())
      else console.warn(`E-mail ${row.id} to ${row.toEmail} failed after ${row.attempts} tries: ${failure}`)
    }
  }
  finally {
    inFlight.delete(row.id)
    for (const wake of waiters.get(row.id) ?? []) wake()
  }
}

function storedAttachments(stored: Array<Record<string, unknown>>) {
  return stored.map((attachment, index) => {
    const { filename, contentType, contentBase64 } = attachment
    if (typeof contentBase64 !== 'string') throw new Error(`Attachment ${index + 1} of this e-mail has no content.`)
    return {
      filename: typeof filename === 'string' ? filename : `attachment-${index + 1}`,
      contentType: typeof contentType === 'string' ? contentType : 'application/octet-stream',
      content: Buffer.from(contentBase64, 'base64'),
    }
  })
}

// What a screen can say right after queueing a message: wait (briefly) for its first try, then
// report what happened. A slow or absent mail server leaves it "queued", and the screen says so.
export async function awaitFirstDelivery(id: number, timeoutMs = 5000): Promise<MailDelivery> {
  const read = () => useDb().select().from(tables.outbox).where(eq(tables.outbox.id, id)).get()
  let row = read()
  if (!row) throw new Error(`No outbox message ${id}`)
  const pending = row.status === 'queued' && (row.attempts === 0 || inFlight.has(id))
  if (worker && pending) {
    await new Promise<void>((resolve) => {
      const set = waiters.get(id) ?? new Set()
      waiters.set(id, set)
      const timer = setTimeout(wake, timeoutMs)
      function wake() {
        clearTimeout(timer)
        set.delete(wake)
        if (!set.size) waiters.delete(id)
        resolve()
      }
      set.add(wake)
    })
    row = read() ?? row
  }
  return { to: row.toEmail, status: row.status, error: row.error }
}
