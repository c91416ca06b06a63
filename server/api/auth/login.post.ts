import { eq } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({
  email: z.string().trim().toLowerCase().min(1, 'enter your e-mail address'),
  password: z.string().min(1, 'enter your password'),
})

// A dummy hash to verify against for unknown addresses, so both failures take the same time.
let dummyHash: Promise<string> | undefined

export default defineEventHandler(async (event) => {
  const { email, password } = await readBodyWith(event, body)
  assertLoginAllowed(event, email)

  const row = useDb().select().from(tables.users).where(eq(tables.users.email, email)).get()
  dummyHash ??= hashPassword('densitas-timing-equaliser')
  const valid = await verifyPassword(row?.passwordHash ?? await dummyHash, password)
  if (!row || !valid) {
    recordLoginFailure(event, email)
    throw createError({ statusCode: 401, message: 'That e-mail and password do not match an account. Check both, or reset your password.' })
  }
  clearLoginFailures(email)

  const user = currentUserFromRow(row)
  await replaceUserSession(event, { user: toSessionUser(user), loggedInAt: Date.now() })
  recordAudit(useDb(), { workshopId: user.workshopId, userId: user.id, action: 'signed-in', entity: 'user', entityId: user.id })
  return { user: toSessionUser(user) }
})
