import { and, eq, gt, isNull, ne } from 'drizzle-orm'

// The numbers on each role's home page, scoped to what the role may see.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { users, invites, cores, workshops, vehicles } = tables
  const workshop = useDb().select({ name: workshops.name, currency: workshops.currency }).from(workshops).where(eq(workshops.id, actor.workshopId)).get()!
  const inWorkshop = eq(users.workshopId, actor.workshopId)
  return {
    workshop,
    vehicles: countRows(vehicles, visibleVehicles(actor)),
    customers: isStaff(actor) ? countRows(users, and(inWorkshop, eq(users.role, 'driver'))) : null,
    staff: canManageMembers(actor) ? countRows(users, and(inWorkshop, ne(users.role, 'driver'))) : null,
    openInvites: canManageMembers(actor)
      ? countRows(invites, and(eq(invites.workshopId, actor.workshopId), isNull(invites.acceptedAt), gt(invites.expiresAt, new Date())))
      : null,
    cores: canViewCores(actor) ? countRows(cores, eq(cores.workshopId, actor.workshopId)) : null,
  }
})
