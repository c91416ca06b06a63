import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { run } = findVisibleDynoRun(actor, id)
  if (!canRecordDynoRuns(actor)) forbidden('Only a tuner or the workshop owner deletes dyno runs.')
  useDb().transaction((tx) => {
    tx.delete(tables.dynoRuns).where(eq(tables.dynoRuns.id, run.id)).run()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'deleted', entity: 'dyno-run', entityId: run.id, detail: { vehicleId: run.vehicleId } })
  })
  setResponseStatus(event, 204)
  return null
})
