import { z } from 'zod'
import { whatIfAmbient } from '../../../analysis/whatif'

const query = z.object({
  ambientC: z.coerce.number({ message: 'ambientC: give the ambient temperature in °C' }).min(-30, 'ambientC is between −30 and 55 °C').max(55, 'ambientC is between −30 and 55 °C'),
})

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { ambientC } = readQueryWith(event, query)
  const { log } = findVisibleLog(actor, id)
  return whatIfAmbient(storedAnalysis(log.id).pulls, ambientC)
})
