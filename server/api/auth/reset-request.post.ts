import { eq } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({ email: emailField })

const RESET_HOURS = 2

// Always the same answer, whether or not the address has an account.
export default defineEventHandler(async (event) => {
  const { email } = await readBodyWith(event, body)
  const db = useDb()
  const user = db.select().from(tables.users).where(eq(tables.users.email, email)).get()
  if (user) {
    const { token, tokenHash } = newToken()
    db.transaction((tx) => {
      tx.insert(tables.passwordResets).values({ userId: user.id, tokenHash, expiresAt: new Date(Date.now() + RESET_HOURS * 3_600_000) }).run()
      queueMail(tx, {
        workshopId: user.workshopId,
        to: user.email,
        subject: 'Reset your Densitas password',
        kind: 'password-reset',
        text: `Hello ${user.name},\n\nSomeone asked to reset the password of your Densitas account. If it was you, open this link within ${RESET_HOURS} hours and choose a new password:\n\n${appLink(`/reset?token=${token}`)}\n\nIf it was not you, ignore this e-mail; your password stays as it is.`,
      })
      recordAudit(tx, { workshopId: user.workshopId, userId: user.id, action: 'requested-password-reset', entity: 'user', entityId: user.id })
    })
  }
  return { ok: true, message: 'If that address has an account, a reset link is on its way. It works for 2 hours.' }
})
