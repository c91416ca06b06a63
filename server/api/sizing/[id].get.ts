export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canSizeCores(actor)) forbidden('Sizing a core is the workshop\'s job. Ask the workshop about an uprated core.')
  const { id } = readParamsWith(event, idParams)
  return findSizing(actor, id)
})
