import { whatIfAmbient } from '../../../analysis/whatif'

export default defineEventHandler(async (event) => {
  const { token } = readParamsWith(event, tokenParams)
  const { ambientC } = readQueryWith(event, whatIfQuery)
  const { log } = findSharedLog(token)
  return whatIfAmbient((await storedAnalysis(log.id)).pulls, ambientC)
})
