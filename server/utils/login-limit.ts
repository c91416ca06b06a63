import { createHash } from 'node:crypto'
import type { H3Event } from 'h3'

// Failed sign-ins slow the next attempt down instead of refusing the right password for a fixed
// time (which let anyone lock a person out by guessing badly on purpose):
//   - one address from one client: the first `perEmail` failures are free, then each further
//     failure doubles the wait (1 s, 2 s, 4 s … up to `maxDelaySeconds`);
//   - one address from any client: the same, from twice as many failures, capped at a minute, so
//     guessing from many machines is slowed without locking the real person out for long;
//   - one client across addresses: after `perIp` failures the client waits out the window.
// A failure streak is forgotten `windowMinutes` after its last failure.
// Kept in memory (one server process; a restart only forgives a few attempts). Keys are hashes of
// fixed length and the table is bounded, so huge e-mail strings or floods of addresses cannot grow it.

interface Streak {
  count: number
  lastAt: number
}

const MAX_KEYS = 20_000
const ADDRESS_ANY_CLIENT_MAX_DELAY_S = 60

export class BoundedCounter {
  private streaks = new Map<string, Streak>()
  constructor(private readonly maxKeys = MAX_KEYS) {}

  get size() {
    return this.streaks.size
  }

  get(key: string, now: number, windowMs: number): Streak {
    const streak = this.streaks.get(key)
    if (!streak || now - streak.lastAt > windowMs) {
      if (streak) this.streaks.delete(key)
      return { count: 0, lastAt: 0 }
    }
    return streak
  }

  add(key: string, now: number, windowMs: number) {
    const count = this.get(key, now, windowMs).count + 1
    // Re-inserting keeps the Map in least-recently-failed order: the first key is the stalest.
    this.streaks.delete(key)
    this.streaks.set(key, { count, lastAt: now })
    while (this.streaks.size > this.maxKeys) {
      this.streaks.delete(this.streaks.keys().next().value!)
    }
    return count
  }

  clear(key: string) {
    this.streaks.delete(key)
  }
}

const failures = new BoundedCounter()

// A fixed-length key whatever the input: an e-mail field of 20 MB costs 64 bytes here.
export function limitKey(kind: string, ...parts: string[]) {
  return `${kind}:${createHash('sha256').update(parts.join('\u0000')).digest('base64url')}`
}

// Behind a configured proxy (NUXT_TRUST_PROXY) the client is the first X-Forwarded-For entry;
// otherwise the socket's address, whatever headers the request carries.
export function clientAddress(event: H3Event) {
  const address = getRequestIP(event, { xForwardedFor: trustsProxy() }) ?? 'unknown'
  return address.slice(0, 64)
}

export function trustsProxy() {
  const value = useRuntimeConfig().trustProxy as unknown
  return value === true || value === 'true' || value === '1'
}

// Seconds to wait after `failures` in a row, when the first `free` ones cost nothing.
export function backoffSeconds(failures: number, free: number, capSeconds: number) {
  if (failures < free) return 0
  return Math.min(capSeconds, 2 ** Math.min(30, failures - free))
}

function settings() {
  const { perEmail, perIp, windowMinutes, maxDelaySeconds } = useRuntimeConfig().loginLimit
  return { perEmail: Number(perEmail), perIp: Number(perIp), windowMs: Number(windowMinutes) * 60_000, maxDelaySeconds: Number(maxDelaySeconds ?? 900) }
}

function keys(event: H3Event, email: string) {
  const client = clientAddress(event)
  return { pair: limitKey('pair', email, client), email: limitKey('email', email), ip: limitKey('ip', client) }
}

function tooSoon(event: H3Event, waitUntil: number, now: number, message: string) {
  if (waitUntil <= now) return
  const retryAfterS = Math.max(1, Math.ceil((waitUntil - now) / 1000))
  setResponseHeader(event, 'Retry-After', retryAfterS)
  throw createError({ statusCode: 429, message: message.replace('{s}', retryAfterS === 1 ? '1 second' : `${retryAfterS} seconds`) })
}

export function assertLoginAllowed(event: H3Event, email: string) {
  const { perEmail, perIp, windowMs, maxDelaySeconds } = settings()
  const now = Date.now()
  const key = keys(event, email)

  const byIp = failures.get(key.ip, now, windowMs)
  if (byIp.count >= perIp) {
    tooSoon(event, byIp.lastAt + windowMs, now, `Too many failed sign-ins from this network. Wait {s} and try again.`)
  }
  const byPair = failures.get(key.pair, now, windowMs)
  tooSoon(event, byPair.lastAt + backoffSeconds(byPair.count, perEmail, maxDelaySeconds) * 1000, now,
    'Several wrong passwords for this address. Wait {s} before the next try, or reset your password from the sign-in page.')
  const byEmail = failures.get(key.email, now, windowMs)
  tooSoon(event, byEmail.lastAt + backoffSeconds(byEmail.count, perEmail * 2, ADDRESS_ANY_CLIENT_MAX_DELAY_S) * 1000, now,
    'Several wrong passwords for this address. Wait {s} before the next try, or reset your password from the sign-in page.')
}

export function recordLoginFailure(event: H3Event, email: string) {
  const { windowMs } = settings()
  const now = Date.now()
  for (const key of Object.values(keys(event, email))) failures.add(key, now, windowMs)
}

// The right password from this client forgets this client's streak for the address; failures
// from other clients keep counting, so a guesser elsewhere gains nothing from it.
export function clearLoginFailures(event: H3Event, email: string) {
  failures.clear(keys(event, email).pair)
}

// A completed password reset proves the mailbox: the address starts afresh from every client.
export function forgetLoginFailures(event: H3Event, email: string) {
  const key = keys(event, email)
  failures.clear(key.pair)
  failures.clear(key.email)
}
