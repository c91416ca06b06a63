import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const vehicle = findVisibleVehicle(actor, id)
  if (!canEditVehicle(actor, vehicle)) forbidden('Your role can look at this car but not change it. Ask a tuner or the workshop owner.')
  const changes = await readBodyWith(event, vehiclePatch)
  if (changes.ownerId !== undefined && changes.ownerId !== vehicle.ownerId) {
    if (!canReassignVehicle(actor)) forbidden('Only the workshop can move a car to another customer.')
    assertDriverOfWorkshop(actor, changes.ownerId)
  }
  assertCoreOfWorkshop(actor, changes.fittedCoreId, vehicle.fittedCoreId)

  return useDb().transaction((tx) => {
    const row = tx.update(tables.vehicles).set({ ...changes, updatedAt: new Date() }).where(eq(tables.vehicles.id, id)).returning().get()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'updated', entity: 'vehicle', entityId: id, detail: { fields: Object.keys(changes) } })
    return row
  })
})
