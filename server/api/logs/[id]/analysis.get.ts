export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { log } = findVisibleLog(actor, id)
  return storedAnalysis(log.id)
})
