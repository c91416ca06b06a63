import { and, asc, eq } from 'drizzle-orm'
import { z } from 'zod'

const query = z.object({ ownerId: z.coerce.number().int().positive().optional() })

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { ownerId } = readQueryWith(event, query)
  const { vehicles, users, cores } = tables
  return useDb()
    .select({
      id: vehicles.id,
      description: vehicles.description,
      registration: vehicles.registration,
      displacementL: vehicles.displacementL,
      cylinders: vehicles.cylinders,
      fuel: vehicles.fuel,
      ratedPowerKw: vehicles.ratedPowerKw,
      fittedCoreId: vehicles.fittedCoreId,
      fittedCoreName: cores.name,
      ownerId: vehicles.ownerId,
      ownerName: users.name,
      notes: vehicles.notes,
      createdAt: vehicles.createdAt,
    })
    .from(vehicles)
    .innerJoin(users, eq(users.id, vehicles.ownerId))
    .leftJoin(cores, eq(cores.id, vehicles.fittedCoreId))
    .where(and(visibleVehicles(actor), ownerId ? eq(vehicles.ownerId, ownerId) : undefined))
    .orderBy(asc(vehicles.description), asc(vehicles.id))
    .all()
})
