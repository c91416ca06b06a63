import { asc, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  // Staff need the customer list to pick a car's owner; only the owner sees everyone.
  if (!canListCustomers(actor)) forbidden('Customers cannot list the workshop\'s people.')
  const { users } = tables
  const rows = useDb().select({ id: users.id, name: users.name, email: users.email, role: users.role, createdAt: users.createdAt })
    .from(users).where(eq(users.workshopId, actor.workshopId)).orderBy(asc(users.name)).all()
  return canManageMembers(actor) ? rows : rows.filter(isCustomer)
})
