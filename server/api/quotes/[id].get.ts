export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  return quoteDetail(findVisibleQuote(actor, id))
})
