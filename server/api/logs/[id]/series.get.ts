export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const query = readQueryWith(event, seriesQuery)
  const { log } = findVisibleLog(actor, id)
  return seriesFor(log, query)
})
