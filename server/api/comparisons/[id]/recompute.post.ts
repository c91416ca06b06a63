import { eq } from 'drizzle-orm'

// After a log's pulls were edited: the same logs and reference ambient, worked out again.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { comparison, vehicle } = findVisibleComparison(actor, id)
  if (!canCompareLogs(actor)) forbidden('Only a tuner or the workshop owner recomputes comparisons.')
  const result = await computeComparison(actor, vehicle, comparisonSides(comparison.id), comparison.referenceAmbientC)
  const row = useDb().transaction((tx) => {
    const updated = tx.update(tables.comparisons).set({ result: result as unknown as Record<string, unknown>, computedAt: new Date(), staleAt: null })
      .where(eq(tables.comparisons.id, comparison.id)).returning().get()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'recomputed', entity: 'comparison', entityId: comparison.id })
    return updated
  })
  return comparisonView(row, vehicle)
})
