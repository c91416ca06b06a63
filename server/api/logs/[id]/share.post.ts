import { formatDate } from '#shared/utils/format'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { log, vehicle } = findVisibleLog(actor, id)
  if (!canShareReport(actor)) forbidden('Only a tuner or the workshop owner can share a report by link.')
  const options = await readBodyWith(event, shareBody)
  const link = await createShareLink(actor, { logId: log.id }, options, vehicle, (driver, url, expiresAt, workshopName) => ({
    kind: 'report-share' as const,
    subject: `Your heat-soak report from ${workshopName}`,
    text: `Hello ${driver.name},\n\n${actor.name} of ${workshopName} has shared the report on the log of your ${vehicle.description}. Open it here, without signing in, until ${formatDate(expiresAt)}:\n\n${url}\n\nQuestions about it? Ask ${workshopName}.`,
  }))
  setResponseStatus(event, 201)
  return link
})
