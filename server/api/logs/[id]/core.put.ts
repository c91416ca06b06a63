import { eq } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({ coreId: z.number({ message: 'choose a core, or none' }).int().positive().nullable() }).strict()

// Correct which core was fitted when the log was made. Staff only; the core must be in the
// workshop's catalogue. Comparisons using the log name cores by log, so they say stale.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { log } = findVisibleLog(actor, id)
  if (!canChangeLogCore(actor)) forbidden('Only the workshop\'s staff record which core was fitted.')
  const { coreId } = await readBodyWith(event, body)
  assertCatalogueCore(actor, coreId)
  useDb().transaction((tx) => {
    tx.update(tables.logs).set({ coreId }).where(eq(tables.logs.id, log.id)).run()
    markComparisonsStale(tx, log.id)
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'updated', entity: 'log', entityId: log.id, detail: { coreId, previousCoreId: log.coreId } })
  })
  const core = coreId ? useDb().select({ id: tables.cores.id, name: tables.cores.name, kind: tables.cores.kind }).from(tables.cores).where(eq(tables.cores.id, coreId)).get() : undefined
  return { core: core ?? null }
})
