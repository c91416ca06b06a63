import { z } from 'zod'
import { DYNO_STANDARDS } from '../../../analysis'

const query = z.object({ standard: z.enum(DYNO_STANDARDS, { message: 'standard is one of sae-j1349-2004, sae-j1349-1990, iso-1585, din-70020' }).optional() })

// Before vs after corrected power, by the standard asked for or the workshop's own.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const vehicle = findVisibleVehicle(actor, id)
  const { standard } = readQueryWith(event, query)
  const chosen = standard ?? workshopStandard(actor.workshopId)
  return { standard: chosen, caution: DYNO_CAUTION, comparison: dynoComparison(vehicleDynoRuns(vehicle), chosen) }
})
