import { eq } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({
  email: emailField,
  role: z.enum(ROLES, { message: `choose a role: ${ROLES.map(role => ROLE_LABELS[role].toLowerCase()).join(', ')}` }),
})

const INVITE_DAYS = 7

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  requireOwner(actor)
  const { email, role } = await readBodyWith(event, body)
  const db = useDb()
  const existing = db.select({ workshopId: tables.users.workshopId }).from(tables.users).where(eq(tables.users.email, email)).get()
  // Only the owner's own people are named; an address with an account elsewhere is answered like
  // a new one (the e-mail itself tells its holder to sign in instead), so other workshops' people stay private.
  if (existing?.workshopId === actor.workshopId) {
    throw createError({ statusCode: 409, message: 'That address already belongs to one of your people. Change their role on the People page instead.' })
  }
  const workshop = db.select().from(tables.workshops).where(eq(tables.workshops.id, actor.workshopId)).get()!
  const { token, tokenHash } = newToken()
  const link = appLink(`/join?token=${token}`)
  const text = existing
    ? `Hello,\n\n${actor.name} of ${workshop.name} invites you to Densitas as ${ROLE_LABELS[role].toLowerCase()}. This address already has a Densitas account with another workshop, and an account belongs to one workshop, so the invitation cannot be taken up with it. Ask ${workshop.name} to invite another address of yours, or sign in to your account as before.\n\nIf you did not expect this, ignore this e-mail.`
    : `Hello,\n\n${actor.name} of ${workshop.name} invites you to Densitas as ${ROLE_LABELS[role].toLowerCase()}. Open this link within ${INVITE_DAYS} days to choose your password:\n\n${link}\n\nIf you did not expect this, ignore this e-mail.`
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
      text,
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
