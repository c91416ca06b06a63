import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canViewCores(actor)) forbidden('The core catalogue is for the workshop\'s staff.')
  const { id } = readParamsWith(event, idParams)
  const core = findCore(actor, id)
  if (!canManageCores(actor)) forbidden('Only the workshop owner and the fabricator bring cores back.')
  if (!core.retiredAt) return coreView(core)
  return coreView(useDb().transaction((tx) => {
    const row = tx.update(tables.cores).set({ retiredAt: null, updatedAt: new Date() }).where(eq(tables.cores.id, id)).returning().get()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'restored', entity: 'core', entityId: id, detail: { name: core.name } })
    return row
  }))
})
