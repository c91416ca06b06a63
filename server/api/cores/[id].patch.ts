import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canViewCores(actor)) forbidden('The core catalogue is for the workshop\'s staff.')
  const { id } = readParamsWith(event, idParams)
  const core = findCore(actor, id)
  if (!canManageCores(actor)) forbidden('Your role can read the catalogue but not change it. Ask the fabricator or the workshop owner.')
  const changes = await readCoreBody(event, corePatchBody)
  if (Object.keys(changes).length === 0) badRequest('Nothing to change: send at least one field of the core.')
  assertFinDensity({ finDensity: changes.finDensity !== undefined ? changes.finDensity : core.finDensity, finDensityUnit: changes.finDensityUnit !== undefined ? changes.finDensityUnit : core.finDensityUnit })

  return coreView(useDb().transaction((tx) => {
    if (changes.name !== undefined) assertNameFree(tx, actor, changes.name, id)
    const row = tx.update(tables.cores).set({ ...changes, updatedAt: new Date() }).where(eq(tables.cores.id, id)).returning().get()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'updated', entity: 'core', entityId: id, detail: { fields: Object.keys(changes) } })
    return row
  }))
})
