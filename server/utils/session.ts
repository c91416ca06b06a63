import { randomUUID } from 'node:crypto'
import type { H3Event } from 'h3'
import { eq, lt, sql } from 'drizzle-orm'
import type { User as SessionUser, UserSession } from '#auth-utils'
import type { Db } from './db'

// A sealed cookie cannot be recalled once issued, so the server decides on every request whether
// it still counts. It counts while:
//   - its `version` equals the person's users.sessionVersion (bumped by "sign out everywhere",
//     a password change or reset: every older cookie ends at once);
//   - its own id `sid` is not in revoked_sessions (plain sign-out ends this one cookie, even replayed);
//   - it is younger than the maximum age, counted from the sign-in itself (refreshing the cookie
//     when a name or role changes does not extend it).

export const SESSION_ENDED = 'You were signed out (on this device or everywhere, or your password changed). Sign in again.'

export function sessionMaxAgeMs() {
  const seconds = Number(useRuntimeConfig().session.maxAge)
  return (Number.isFinite(seconds) && seconds > 0 ? seconds : 14 * 86_400) * 1000
}

// A new sign-in on this device: a fresh session id and clock.
export async function startSession(event: H3Event, user: SessionUser, sessionVersion: number) {
  await replaceUserSession(event, { user, loggedInAt: Date.now(), sid: randomUUID(), version: sessionVersion })
}

// The same sign-in with fresher details (name, role) or a new version after a password change.
export async function refreshSession(event: H3Event, session: UserSession, user: SessionUser, sessionVersion = session.version) {
  await replaceUserSession(event, { user, loggedInAt: session.loggedInAt, sid: session.sid, version: sessionVersion })
}

// Why the session no longer counts, or null while it does.
export function sessionProblem(session: UserSession, row: { sessionVersion: number } | undefined): string | null {
  if (!row) return 'Your account no longer exists. Ask the workshop owner for a new invitation.'
  if (typeof session.loggedInAt !== 'number' || Date.now() - session.loggedInAt > sessionMaxAgeMs()) {
    return 'Your sign-in has expired. Sign in again.'
  }
  if (typeof session.sid !== 'string' || session.version !== row.sessionVersion) return SESSION_ENDED
  const revoked = useDb().select({ sessionId: tables.revokedSessions.sessionId }).from(tables.revokedSessions)
    .where(eq(tables.revokedSessions.sessionId, session.sid)).get()
  return revoked ? SESSION_ENDED : null
}

// Sign out this device: the cookie's id is refused from now on, until it would have expired anyway.
export function revokeSession(db: Pick<Db, 'insert' | 'delete'>, session: UserSession) {
  if (!session.sid || !session.user) return
  const now = Date.now()
  db.delete(tables.revokedSessions).where(lt(tables.revokedSessions.expiresAt, new Date(now))).run()
  db.insert(tables.revokedSessions).values({
    sessionId: session.sid,
    userId: session.user.id,
    expiresAt: new Date((session.loggedInAt ?? now) + sessionMaxAgeMs()),
  }).onConflictDoNothing().run()
}

// Sign out everywhere: every cookie issued so far carries an older version. Returns the new version.
export function endAllSessions(db: Pick<Db, 'update'>, userId: number): number {
  const row = db.update(tables.users).set({ sessionVersion: sql`${tables.users.sessionVersion} + 1` })
    .where(eq(tables.users.id, userId)).returning({ sessionVersion: tables.users.sessionVersion }).get()
  return row?.sessionVersion ?? 0
}

// For routes outside requireActor that still trust a session (nuxt-auth-utils' /api/_auth/session).
export async function assertSessionValid(event: H3Event, session: UserSession) {
  if (!session.user) return
  const row = useDb().select({ sessionVersion: tables.users.sessionVersion }).from(tables.users)
    .where(eq(tables.users.id, session.user.id)).get()
  const problem = sessionProblem(session, row)
  if (problem) {
    await clearUserSession(event)
    throw createError({ statusCode: 401, message: problem })
  }
}
