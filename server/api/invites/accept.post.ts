import { eq } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({
  token: z.string().min(10, 'the invitation link is incomplete'),
  name: z.string().trim().min(1, 'enter your name').max(100),
  password: newPasswordField,
})

export default defineEventHandler(async (event) => {
  const { token, name, password } = await readBodyWith(event, body)
  const { invite } = findOpenInvite(token)
  const db = useDb()
  if (db.select({ id: tables.users.id }).from(tables.users).where(eq(tables.users.email, invite.email)).get()) {
    throw createError({ statusCode: 409, message: 'That e-mail address already has an account. Sign in instead.' })
  }
  const passwordHash = await hashPassword(password)
  const row = db.transaction((tx) => {
    const user = tx.insert(tables.users).values({ workshopId: invite.workshopId, email: invite.email, name, passwordHash, role: invite.role }).returning().get()
    tx.update(tables.invites).set({ acceptedAt: new Date() }).where(eq(tables.invites.id, invite.id)).run()
    recordAudit(tx, { workshopId: invite.workshopId, userId: user.id, action: 'joined', entity: 'user', entityId: user.id, detail: { inviteId: invite.id } })
    return user
  })
  const user = toSessionUser(currentUserFromRow(row))
  await replaceUserSession(event, { user, loggedInAt: Date.now() })
  setResponseStatus(event, 201)
  return { user }
})
