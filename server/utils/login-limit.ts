import type { H3Event } from 'h3'

// Failed sign-ins are counted per e-mail address and per client address in a sliding window.
// Kept in memory: one server process, and a restart only forgives a few attempts.
const failures = new Map<string, number[]>()

function windowMs() {
  return useRuntimeConfig().loginLimit.windowMinutes * 60_000
}

function recent(key: string, now: number) {
  const list = (failures.get(key) ?? []).filter(at => now - at < windowMs())
  if (list.length) failures.set(key, list)
  else failures.delete(key)
  return list
}

export function clientAddress(event: H3Event) {
  return getRequestIP(event, { xForwardedFor: Boolean(useRuntimeConfig().trustProxy) }) ?? 'unknown'
}

export function assertLoginAllowed(event: H3Event, email: string) {
  const { perEmail, perIp, windowMinutes } = useRuntimeConfig().loginLimit
  const now = Date.now()
  const byEmail = recent(`email:${email}`, now)
  const byIp = recent(`ip:${clientAddress(event)}`, now)
  const blocked = byEmail.length >= perEmail ? byEmail : byIp.length >= perIp ? byIp : null
  if (blocked) {
    const retryAfterS = Math.max(1, Math.ceil((blocked[0]! + windowMs() - now) / 1000))
    setResponseHeader(event, 'Retry-After', retryAfterS)
    throw createError({
      statusCode: 429,
      message: byEmail === blocked
        ? `Too many failed sign-ins for this address. Wait ${windowMinutes} minutes, or reset your password from the sign-in page.`
        : `Too many failed sign-ins from this network. Wait ${windowMinutes} minutes and try again.`,
    })
  }
}

export function recordLoginFailure(event: H3Event, email: string) {
  const now = Date.now()
  for (const key of [`email:${email}`, `ip:${clientAddress(event)}`]) {
    failures.set(key, [...recent(key, now), now])
  }
}

export function clearLoginFailures(email: string) {
  failures.delete(`email:${email}`)
}
