import { eq } from 'drizzle-orm'
import { isQuoteEditable, quoteTotals } from '#shared/utils/quotes'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const quote = findVisibleQuote(actor, id)
  requireQuoteWriter(actor)
  if (!isQuoteEditable(quote.status)) {
    quoteConflict(quote.status === 'sent' || quote.status === 'declined' || quote.status === 'expired'
      ? 'The customer has this quote already: revise it first (it goes back to draft as a new revision), then change it.'
      : 'This quote can no longer be changed.')
  }
  const changes = await readQuoteBody(event, patchQuoteBody)
  if (changes.coreId != null) assertQuotableCore(actor.workshopId, changes.coreId)
  const db = useDb()
  return db.transaction((tx) => {
    // Only the keys sent are written; the totals always follow the stored lines and rates.
    const lines = changes.lines ?? quoteLinesOf(id, tx)
    const taxRatePct = changes.taxRatePct ?? quote.taxRatePct
    const depositPct = changes.depositPct ?? quote.depositPct
    const totals = quoteTotals(lines, taxRatePct, depositPct)
    if (changes.lines) writeQuoteLines(tx, id, changes.lines)
    const fields: Omit<typeof changes, 'lines'> & { lines?: unknown } = { ...changes }
    delete fields.lines
    tx.update(tables.quotes).set({
      ...fields,
      subtotalCents: totals.subtotalCents,
      taxCents: totals.taxCents,
      totalCents: totals.totalCents,
      depositCents: totals.depositCents,
      updatedAt: new Date(),
    }).where(eq(tables.quotes.id, id)).run()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'updated', entity: 'quote', entityId: id, detail: { fields: Object.keys(changes), totalCents: totals.totalCents } })
    return quoteDetail(tx.select().from(tables.quotes).where(eq(tables.quotes.id, id)).get()!)
  })
})
