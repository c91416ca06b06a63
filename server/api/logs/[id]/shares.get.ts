export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { log } = findVisibleLog(actor, id)
  if (!canShareReport(actor)) forbidden('Only a tuner or the workshop owner manages shared links.')
  return shareLinksOf({ logId: log.id })
})
