export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canCreateVehicle(actor)) forbidden('Your role cannot add cars. Ask a tuner or the workshop owner.')
  const input = await readBodyWith(event, vehicleFields)

  // A driver adds cars to their own account only; staff choose the customer.
  let ownerId = actor.id
  if (!canChooseCarCustomer(actor)) {
    if (input.ownerId !== undefined && input.ownerId !== actor.id) forbidden('You can add cars to your own account only.')
  }
  else {
    if (input.ownerId === undefined) badRequest('choose the customer whose car this is.')
    assertDriverOfWorkshop(actor, input.ownerId)
    ownerId = input.ownerId
  }
  assertCoreOfWorkshop(actor, input.fittedCoreId)

  const db = useDb()
  const vehicle = db.transaction((tx) => {
    const row = tx.insert(tables.vehicles).values({ ...input, ownerId, workshopId: actor.workshopId }).returning().get()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'created', entity: 'vehicle', entityId: row.id })
    return row
  })
  setResponseStatus(event, 201)
  return vehicle
})
