export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canManageCores(actor)) forbidden('Only the workshop owner and the fabricator add cores to the catalogue.')
  const fields = await readCoreBody(event, newCoreBody)
  assertFinDensity({ finDensity: fields.finDensity ?? null, finDensityUnit: fields.finDensityUnit ?? null })

  const core = useDb().transaction((tx) => {
    assertNameFree(tx, actor, fields.name)
    const row = tx.insert(tables.cores).values({ ...fields, notes: fields.notes ?? '', workshopId: actor.workshopId }).returning().get()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'created', entity: 'core', entityId: row.id, detail: { name: row.name } })
    return row
  })
  setResponseStatus(event, 201)
  return coreView(core)
})
