import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { log } = findVisibleLog(actor, id)
  if (!canDeleteLog(actor)) forbidden('Only a tuner or the workshop owner can delete a log.')
  useDb().transaction((tx) => {
    tx.delete(tables.logs).where(eq(tables.logs.id, log.id)).run()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'deleted', entity: 'log', entityId: log.id, detail: { originalName: log.originalName } })
  })
  forgetImported(log.id)
  await removeLogFile(log.id)
  setResponseStatus(event, 204)
  return null
})
