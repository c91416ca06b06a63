import { eq } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({
  email: z.string().trim().toLowerCase().min(1, 'enter your e-mail address').max(254, 'an e-mail address has at most 254 characters'),
  password: z.string({ message: 'enter your password' }).min(1, 'enter your password').max(200, 'a password has at most 200 characters'),
})

export default defineEventHandler(async (event) => {
  const { email, password } = await readBodyWith(event, body)
  assertLoginAllowed(event, email)

  const row = useDb().select().from(tables.users).where(eq(tables.users.email, email)).get()
  // An unknown address is checked against a dummy hash, so both failures cost one scrypt.
  const valid = await verifyPassword(row?.passwordHash ?? await timingDummyHash(), password)
  if (!row || !valid) {
    recordLoginFailure(event, email)
    throw createError({ statusCode: 401, message: 'That e-mail and password do not match an account. Check both, or reset your password.' })
  }
  clearLoginFailures(event, email)

  const user = currentUserFromRow(row)
  await startSession(event, toSessionUser(user), row.sessionVersion)
  recordAudit(useDb(), { workshopId: user.workshopId, userId: user.id, action: 'signed-in', entity: 'user', entityId: user.id })
  return { user: toSessionUser(user) }
})
