export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { log, vehicle } = findVisibleLog(actor, id)
  return logDetail(log, vehicle)
})
