import { whatIfAmbient } from '../../../analysis/whatif'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { ambientC } = readQueryWith(event, whatIfQuery)
  const { log } = findVisibleLog(actor, id)
  return whatIfAmbient((await storedAnalysis(log.id)).pulls, ambientC)
})
