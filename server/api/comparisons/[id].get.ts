export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { comparison, vehicle } = findVisibleComparison(actor, id)
  return comparisonView(comparison, vehicle)
})
