// When to try an e-mail again. Pure functions: the delivery loop and the unit tests call them.

// Five tries in all by default: at once, then 10 s, 1 min, 5 min and 30 min after each failure,
// so a mail server that is down for a restart or a short outage does not lose a message.
export const DEFAULT_RETRY_DELAYS = '10s,1m,5m,30m'

const UNIT_MS: Record<string, number> = { ms: 1, s: 1000, m: 60_000, h: 3_600_000 }

// "10s,1m,5m" → [10000, 60000, 300000]. A bad value stops the start-up with a message saying why,
// rather than sending with a schedule nobody asked for.
export function parseRetryDelays(spec: string): number[] {
  const parts = spec.split(',').map(part => part.trim()).filter(Boolean)
  return parts.map((part) => {
    const match = /^(\d+(?:\.\d+)?)(ms|s|m|h)$/.exec(part)
    if (!match) throw new Error(`MAIL_RETRY_DELAYS: "${part}" is not a delay. Write delays like 10s, 1m, 5m or 250ms, separated by commas.`)
    return Math.round(Number(match[1]) * UNIT_MS[match[2]!]!)
  })
}

export const maxMailAttempts = (delaysMs: readonly number[]) => delaysMs.length + 1

export type AfterFailure
  = | { status: 'queued', nextAttemptAt: Date }
    | { status: 'failed', nextAttemptAt: null }

// `attemptsMade` counts the try that just failed. After the last allowed try the message is
// failed for good (until someone asks for it again from the outbox).
export function nextAfterFailure(attemptsMade: number, delaysMs: readonly number[], now: Date): AfterFailure {
  if (attemptsMade >= maxMailAttempts(delaysMs)) return { status: 'failed', nextAttemptAt: null }
  const delay = delaysMs[Math.max(0, attemptsMade - 1)]!
  return { status: 'queued', nextAttemptAt: new Date(now.getTime() + delay) }
}

// The text kept with a failed try: the server's own words, on one line, not a whole stack.
export function describeSendError(error: unknown): string {
  const raw = error instanceof Error ? error.message : String(error)
  const line = raw.replace(/\s+/g, ' ').trim() || 'unknown error'
  return line.length > 500 ? `${line.slice(0, 497)}…` : line
}
