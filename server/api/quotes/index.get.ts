import { and, desc, eq } from 'drizzle-orm'
import { z } from 'zod'
import { QUOTE_STATES } from '#shared/utils/quotes'

const query = z.object({
  vehicleId: z.coerce.number().int().positive().optional(),
  status: z.enum(QUOTE_STATES, { message: `status is one of ${QUOTE_STATES.join(', ')}` }).optional(),
})

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { vehicleId, status } = readQueryWith(event, query)
  expireDueQuotes(actor)
  const q = tables.quotes
  return useDb().select({
    id: q.id, number: q.number, status: q.status, revision: q.revision, currency: q.currency,
    totalCents: q.totalCents, depositCents: q.depositCents, validUntil: q.validUntil, sentAt: q.sentAt, paidAt: q.paidAt,
    createdAt: q.createdAt, updatedAt: q.updatedAt,
    vehicle: { id: tables.vehicles.id, description: tables.vehicles.description, registration: tables.vehicles.registration },
    customer: { id: tables.users.id, name: tables.users.name },
  })
    .from(q)
    .innerJoin(tables.vehicles, eq(tables.vehicles.id, q.vehicleId))
    .innerJoin(tables.users, eq(tables.users.id, q.customerId))
    .where(and(visibleQuotes(actor), vehicleId ? eq(q.vehicleId, vehicleId) : undefined, status ? eq(q.status, status) : undefined))
    .orderBy(desc(q.id))
    .all()
})
