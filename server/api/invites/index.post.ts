import { eq } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({
  email: emailField,
  role: z.enum(ROLES, { message: `role is one of ${ROLES.join(', ')}` }),
})

const INVITE_DAYS = 7

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  requireOwner(actor)
  const { email, role } = await readBodyWith(event, body)
  const db = useDb()
  if (db.select({ id: tables.users.id }).from(tables.users).where(eq(tables.users.email, email)).get()) {
    throw createError({ statusCode: 409, message: 'That e-mail address already has a Densitas account. Use another address.' })
  }
  const workshop = db.select().from(tables.workshops).where(eq(tables.workshops.id, actor.workshopId)).get()!
  const { token, tokenHash } = newToken()
  const link = appLink(`/join?token=${token}`)
  const { invite, mailId } = db.transaction((tx) => {
    const row = tx.insert(tables.invites).values({
      workshopId: actor.workshopId,
      email,
      role,
      tokenHash,
      invitedById: actor.id,
      expiresAt: new Date(Date.now() + INVITE_DAYS * 86_400_000),
    }).returning({ id: tables.invites.id, email: tables.invites.email, role: tables.invites.role, expiresAt: tables.invites.expiresAt }).get()
    const mail = queueMail(tx, {
      workshopId: actor.workshopId,
      to: email,
      subject: `${workshop.name} invites you to Densitas`,
      kind: 'invite',
      text: `Hello,\n\n${actor.name} of ${workshop.name} invites you to Densitas as ${ROLE_LABELS[role].toLowerCase()}. Open this link within ${INVITE_DAYS} days to choose your password:\n\n${link}\n\nIf you did not expect this, ignore this e-mail.`,
    })
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'invited', entity: 'invite', entityId: row.id, detail: { email, role } })
    return { invite: row, mailId: mail.id }
  })
  // Say whether the e-mail really went, not only that it was queued.
  const mail = await awaitFirstDelivery(mailId)
  setResponseStatus(event, 201)
  // The owner sees the link too, to pass it on by hand if the e-mail does not arrive.
  return { ...invite, link, mail }
})
