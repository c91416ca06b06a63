import { and, count, eq, gt } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({ email: emailField })

const RESET_HOURS = 2
// At most this many reset e-mails per address per hour; more requests get the same answer and no e-mail.
const MAILS_PER_ADDRESS_PER_HOUR = 3
// Requests per client per hour, whatever the addresses (counted alike for known and unknown ones).
const REQUESTS_PER_CLIENT_PER_HOUR = 20
// Every answer takes at least this long, with or without an account behind the address.
const ANSWER_FLOOR_MS = 250

const requestsByClient = new BoundedCounter()

// Always the same answer, whether or not the address has an account.
export default defineEventHandler(async (event) => {
  const { email } = await readBodyWith(event, body)
  const clientKey = limitKey('reset-client', clientAddress(event))
  const now = Date.now()
  if (requestsByClient.get(clientKey, now, 3_600_000).count >= REQUESTS_PER_CLIENT_PER_HOUR) {
    setResponseHeader(event, 'Retry-After', 3600)
    throw createError({ statusCode: 429, message: 'Too many reset requests from this network. Wait an hour, or ask the workshop owner for help.' })
  }
  requestsByClient.add(clientKey, now, 3_600_000)

  await withTimeFloor(ANSWER_FLOOR_MS, () => {
    const db = useDb()
    const user = db.select().from(tables.users).where(eq(tables.users.email, email)).get()
    if (!user) return
    const { passwordResets } = tables
    const recent = db.select({ n: count() }).from(passwordResets)
      .where(and(eq(passwordResets.userId, user.id), gt(passwordResets.createdAt, new Date(now - 3_600_000)))).get()!.n
    if (recent >= MAILS_PER_ADDRESS_PER_HOUR) return
    const { token, tokenHash } = newToken()
    db.transaction((tx) => {
      tx.insert(passwordResets).values({ userId: user.id, tokenHash, expiresAt: new Date(now + RESET_HOURS * 3_600_000) }).run()
      queueMail(tx, {
        workshopId: user.workshopId,
        to: user.email,
        subject: 'Reset your Densitas password',
        kind: 'password-reset',
        text: `Hello ${user.name},\n\nSomeone asked to reset the password of your Densitas account. If it was you, open this link within ${RESET_HOURS} hours and choose a new password:\n\n${appLink(`/reset?token=${token}`)}\n\nIf it was not you, ignore this e-mail; your password stays as it is.`,
      })
      recordAudit(tx, { workshopId: user.workshopId, userId: user.id, action: 'requested-password-reset', entity: 'user', entityId: user.id })
    })
  })
  return { ok: true, message: `If that address has an account, a reset link is on its way. It works for ${RESET_HOURS} hours.` }
})
