import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const vehicle = findVisibleVehicle(actor, id)
  if (!canDeleteVehicle(actor)) forbidden('Only a tuner or the workshop owner can delete a car, because its logs and reports go with it.')

  const db = useDb()
  const logIds = db.select({ id: tables.logs.id }).from(tables.logs).where(eq(tables.logs.vehicleId, vehicle.id)).all()
  db.transaction((tx) => {
    tx.delete(tables.vehicles).where(eq(tables.vehicles.id, vehicle.id)).run()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'deleted', entity: 'vehicle', entityId: vehicle.id, detail: { description: vehicle.description, logs: logIds.length } })
  })
  // The rows are gone; now the stored files of its logs.
  await Promise.all(logIds.map(log => removeLogFile(log.id)))
  setResponseStatus(event, 204)
  return null
})
