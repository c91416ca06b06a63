import { z } from 'zod'

const query = z.object({ vehicleId: z.coerce.number().int().positive().optional() })

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { vehicleId } = readQueryWith(event, query)
  // A car the actor cannot see is a 404, not an empty list.
  if (vehicleId) findVisibleVehicle(actor, vehicleId)
  return listComparisons(actor, vehicleId)
})
