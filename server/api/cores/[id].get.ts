export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canViewCores(actor)) forbidden('The core catalogue is for the workshop\'s staff.')
  const { id } = readParamsWith(event, idParams)
  return coreView(findCore(actor, id))
})
