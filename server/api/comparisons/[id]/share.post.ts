import { formatDate } from '#shared/utils/format'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { comparison, vehicle } = findVisibleComparison(actor, id)
  if (!canShareReport(actor)) forbidden('Only a tuner or the workshop owner can share a comparison by link.')
  const options = await readBodyWith(event, shareBody)
  const link = await createShareLink(actor, { comparisonId: comparison.id }, options, vehicle, (driver, url, expiresAt, workshopName) => ({
    kind: 'comparison-share' as const,
    subject: `Before and after: your intercooler comparison from ${workshopName}`,
    text: `Hello ${driver.name},\n\n${actor.name} of ${workshopName} has shared the before-and-after comparison of your ${vehicle.description}. Open it here, without signing in, until ${formatDate(expiresAt)}:\n\n${url}\n\nQuestions about it? Ask ${workshopName}.`,
  }))
  setResponseStatus(event, 201)
  return link
})
