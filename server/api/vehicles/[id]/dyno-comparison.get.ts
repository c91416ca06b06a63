import { z } from 'zod'
import { DYNO_STANDARDS } from '../../../analysis'

const query = z.object({ standard: z.enum(DYNO_STANDARDS, { message: 'choose one of the listed correction standards' }).optional() })

// Before vs after corrected power, by the standard asked for or the workshop's own.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const vehicle = findVisibleVehicle(actor, id)
  const { standard } = readQueryWith(event, query)
  const chosen = standard ?? workshopStandard(actor.workshopId)
  return { standard: chosen, caution: DYNO_CAUTION, comparison: dynoComparison(vehicleDynoRuns(vehicle), chosen) }
})
