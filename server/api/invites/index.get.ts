import { and, desc, eq, isNull } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  requireOwner(actor)
  const { invites } = tables
  return useDb().select({ id: invites.id, email: invites.email, role: invites.role, expiresAt: invites.expiresAt, createdAt: invites.createdAt })
    .from(invites)
    .where(and(eq(invites.workshopId, actor.workshopId), isNull(invites.acceptedAt)))
    .orderBy(desc(invites.createdAt))
    .all()
})
