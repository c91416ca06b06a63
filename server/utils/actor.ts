import type { H3Event } from 'h3'
import { eq } from 'drizzle-orm'
import type { Actor } from '#shared/utils/abilities'

export interface CurrentUser extends Actor {
  email: string
  name: string
  preferences: Record<string, string>
}

// The session only says who signed in; the role and workshop are re-read from the database on
// every request, so a role changed by the owner takes effect on the next request. The session
// itself is checked too (version, sign-out, age: server/utils/session.ts).
export async function requireActor(event: H3Event): Promise<CurrentUser> {
  const session = await requireUserSession(event, { message: 'Sign in first: this needs a Densitas account.' })
  const row = useDb().select().from(tables.users).where(eq(tables.users.id, session.user.id)).get()
  const problem = sessionProblem(session, row)
  if (problem || !row) {
    await clearUserSession(event)
    throw createError({ statusCode: 401, message: problem ?? SESSION_ENDED })
  }
  const user = currentUserFromRow(row)
  if (session.user.role !== user.role || session.user.workshopId !== user.workshopId || session.user.name !== user.name) {
    await refreshSession(event, session, toSessionUser(user))
  }
  event.context.actor = user
  return user
}

export function toSessionUser(user: CurrentUser) {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    workshopId: user.workshopId,
    preferences: user.preferences,
  }
}

export function currentUserFromRow(row: typeof tables.users.$inferSelect): CurrentUser {
  return { id: row.id, role: row.role, workshopId: row.workshopId, email: row.email, name: row.name, preferences: row.preferences }
}
