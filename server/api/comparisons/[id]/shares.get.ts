export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { comparison } = findVisibleComparison(actor, id)
  if (!canShareReport(actor)) forbidden('Only a tuner or the workshop owner manages shared links.')
  return shareLinksOf({ comparisonId: comparison.id })
})
