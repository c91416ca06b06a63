import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { comparison } = findVisibleComparison(actor, id)
  if (!canCompareLogs(actor)) forbidden('Only a tuner or the workshop owner deletes comparisons.')
  useDb().transaction((tx) => {
    tx.delete(tables.comparisons).where(eq(tables.comparisons.id, comparison.id)).run()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'deleted', entity: 'comparison', entityId: comparison.id, detail: { vehicleId: comparison.vehicleId } })
  })
  setResponseStatus(event, 204)
  return null
})
