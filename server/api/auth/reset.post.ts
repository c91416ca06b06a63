import { and, eq, gt, isNull } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({
  token: z.string().min(10, 'the reset link is incomplete').max(200, 'the reset link is not one of ours'),
  password: newPasswordField,
})

// A reset ends every sign-in of the person and every other reset link they were sent; this
// device is signed in with the new password.
export default defineEventHandler(async (event) => {
  const { token, password } = await readBodyWith(event, body)
  const db = useDb()
  const { passwordResets } = tables
  const reset = db.select().from(passwordResets).where(and(
    eq(passwordResets.tokenHash, hashToken(token)),
    isNull(passwordResets.usedAt),
    gt(passwordResets.expiresAt, new Date()),
  )).get()
  if (!reset) {
    badRequest('This reset link has expired or was already used. Ask for a new one from the sign-in page.')
  }
  const passwordHash = await hashPassword(password)
  const user = db.transaction((tx) => {
    // Guarded by usedAt IS NULL: of two requests with the same link, only one changes the password.
    const used = tx.update(passwordResets).set({ usedAt: new Date() })
      .where(and(eq(passwordResets.userId, reset.userId), isNull(passwordResets.usedAt))).returning({ id: passwordResets.id }).all()
    if (!used.some(r => r.id === reset.id)) return null
    const row = tx.update(tables.users).set({ passwordHash }).where(eq(tables.users.id, reset.userId)).returning().get()
    const sessionVersion = endAllSessions(tx, row.id)
    recordAudit(tx, { workshopId: row.workshopId, userId: row.id, action: 'reset-password', entity: 'user', entityId: row.id, detail: { linksClosed: used.length } })
    return { ...row, sessionVersion }
  })
  if (!user) badRequest('This reset link has expired or was already used. Ask for a new one from the sign-in page.')
  forgetLoginFailures(event, user.email)
  const sessionUser = toSessionUser(currentUserFromRow(user))
  await startSession(event, sessionUser, user.sessionVersion)
  return { user: sessionUser }
})
