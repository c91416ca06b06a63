import { eq } from 'drizzle-orm'

// Retiring keeps the row: old logs, quotes and evidence still name the core; it is only no longer
// offered for new sizing, quotes or fitting.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canViewCores(actor)) forbidden('The core catalogue is for the workshop\'s staff.')
  const { id } = readParamsWith(event, idParams)
  const core = findCore(actor, id)
  if (!canManageCores(actor)) forbidden('Only the workshop owner and the fabricator retire cores.')
  if (core.retiredAt) return coreView(core)
  return coreView(useDb().transaction((tx) => {
    const row = tx.update(tables.cores).set({ retiredAt: new Date(), updatedAt: new Date() }).where(eq(tables.cores.id, id)).returning().get()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'retired', entity: 'core', entityId: id, detail: { name: core.name } })
    return row
  }))
})
