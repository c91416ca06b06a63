export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canSizeCores(actor)) forbidden('Sizing a core is the workshop\'s job. Ask the workshop about an uprated core.')
  const input = await readLabelledBody(event, sizingBody, SIZING_LABELS, 'sizing request')
  return runSizing(actor, input)
})
