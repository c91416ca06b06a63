export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { comparison, vehicle } = findVisibleComparison(actor, id)
  if (!canShareReport(actor)) forbidden('Only a tuner or the workshop owner can share a comparison by link.')
  const options = await readBodyWith(event, shareBody)
  const link = await createShareLink(actor, { comparisonId: comparison.id }, options, vehicle, (driver, url, expiresAt, workshopName) => ({
    kind: 'comparison-share' as const,
    subject: `Before and after: your intercooler comparison from ${workshopName}`,
    text: `Hello ${driver.name},\n\n${actor.name} of ${workshopName} has shared the before-and-after comparison of your ${vehicle.description}. Open it here (no sign-in needed) until ${expiresAt.toDateString()}:\n\n${url}\n\nReply to the workshop with any questions.`,
  }))
  setResponseStatus(event, 201)
  return link
})
