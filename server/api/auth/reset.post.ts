import { and, eq, gt, isNull } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({
  token: z.string().min(10, 'the reset link is incomplete'),
  password: newPasswordField,
})

export default defineEventHandler(async (event) => {
  const { token, password } = await readBodyWith(event, body)
  const db = useDb()
  const reset = db.select().from(tables.passwordResets).where(and(
    eq(tables.passwordResets.tokenHash, hashToken(token)),
    isNull(tables.passwordResets.usedAt),
    gt(tables.passwordResets.expiresAt, new Date()),
  )).get()
  if (!reset) {
    badRequest('This reset link has expired or was already used. Ask for a new one from the sign-in page.')
  }
  const passwordHash = await hashPassword(password)
  const user = db.transaction((tx) => {
    tx.update(tables.passwordResets).set({ usedAt: new Date() }).where(eq(tables.passwordResets.id, reset.id)).run()
    const row = tx.update(tables.users).set({ passwordHash }).where(eq(tables.users.id, reset.userId)).returning().get()
    recordAudit(tx, { workshopId: row.workshopId, userId: row.id, action: 'reset-password', entity: 'user', entityId: row.id })
    return row
  })
  clearLoginFailures(user.email)
  await replaceUserSession(event, { user: toSessionUser(currentUserFromRow(user)), loggedInAt: Date.now() })
  return { user: toSessionUser(currentUserFromRow(user)) }
})
