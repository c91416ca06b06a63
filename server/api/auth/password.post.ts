import { eq } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({
  currentPassword: z.string().min(1, 'enter your current password').max(200, 'a password has at most 200 characters'),
  newPassword: newPasswordField,
})

// A new password ends every other sign-in of this person; this device stays signed in.
// Wrong current passwords count like failed sign-ins, so a stolen session cannot guess it freely.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { currentPassword, newPassword } = await readBodyWith(event, body)
  assertLoginAllowed(event, actor.email)
  const db = useDb()
  const row = db.select().from(tables.users).where(eq(tables.users.id, actor.id)).get()!
  if (!await verifyPassword(row.passwordHash, currentPassword)) {
    recordLoginFailure(event, actor.email)
    badRequest('Your current password is not right. Type it again, or sign out and reset it by e-mail.')
  }
  clearLoginFailures(event, actor.email)
  const passwordHash = await hashPassword(newPassword)
  const sessionVersion = db.transaction((tx) => {
    tx.update(tables.users).set({ passwordHash }).where(eq(tables.users.id, actor.id)).run()
    const version = endAllSessions(tx, actor.id)
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'changed-password', entity: 'user', entityId: actor.id })
    return version
  })
  await refreshSession(event, await getUserSession(event), toSessionUser(actor), sessionVersion)
  return { ok: true }
})
