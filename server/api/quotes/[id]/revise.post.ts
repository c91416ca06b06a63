// Changing a quote the customer has seen: back to draft as the next revision (same number).
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const quote = findVisibleQuote(actor, id)
  requireQuoteWriter(actor)
  const row = useDb().transaction(tx => moveQuote(tx, quote, 'revise', actor.id, { revision: quote.revision + 1, acceptedAt: null, declinedAt: null }))
  return quoteDetail(row)
})
