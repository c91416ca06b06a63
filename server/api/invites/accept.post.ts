import { and, eq, isNull } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({
  token: z.string().min(10, 'the invitation link is incomplete').max(200, 'the invitation link is not one of ours'),
  name: z.string().trim().min(1, 'enter your name').max(120, 'keep your name under 120 characters'),
  password: newPasswordField,
})

const ALREADY_USED = 'This invitation was used a moment ago. Sign in with the password chosen then.'
const HAS_ACCOUNT = 'That e-mail address already has an account. Sign in instead.'

export default defineEventHandler(async (event) => {
  const { token, name, password } = await readBodyWith(event, body)
  const { invite } = findOpenInvite(token)
  const db = useDb()
  if (db.select({ id: tables.users.id }).from(tables.users).where(eq(tables.users.email, invite.email)).get()) {
    throw createError({ statusCode: 409, message: HAS_ACCOUNT })
  }
  const passwordHash = await hashPassword(password)
  // Several accepts of one link can pass the checks above while the hash is computed; the
  // transaction claims the invitation first, so exactly one of them creates the account.
  const outcome = db.transaction((tx) => {
    if (tx.select({ id: tables.users.id }).from(tables.users).where(eq(tables.users.email, invite.email)).get()) {
      return { conflict: HAS_ACCOUNT } as const
    }
    const claimed = tx.update(tables.invites).set({ acceptedAt: new Date() })
      .where(and(eq(tables.invites.id, invite.id), isNull(tables.invites.acceptedAt))).returning({ id: tables.invites.id }).get()
    if (!claimed) return { conflict: ALREADY_USED } as const
    const user = tx.insert(tables.users).values({ workshopId: invite.workshopId, email: invite.email, name, passwordHash, role: invite.role }).returning().get()
    recordAudit(tx, { workshopId: invite.workshopId, userId: user.id, action: 'joined', entity: 'user', entityId: user.id, detail: { inviteId: invite.id } })
    return { user } as const
  })
  if ('conflict' in outcome) throw createError({ statusCode: 409, message: outcome.conflict })
  const user = toSessionUser(currentUserFromRow(outcome.user))
  await startSession(event, user, outcome.user.sessionVersion)
  setResponseStatus(event, 201)
  return { user }
})
