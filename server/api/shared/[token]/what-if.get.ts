import { whatIfAmbient } from '../../../analysis/whatif'

export default defineEventHandler((event) => {
  const { token } = readParamsWith(event, tokenParams)
  const { ambientC } = readQueryWith(event, whatIfQuery)
  const { log } = findSharedLog(token)
  return whatIfAmbient(storedAnalysis(log.id).pulls, ambientC)
})
