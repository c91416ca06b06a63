import type { H3Event } from 'h3'
import type { QuoteMove } from '#shared/utils/quotes'

// The simple moves share one handler: who may make the move, then the state machine decides.
// accept/decline are the customer's; start/complete/cancel are the workshop's.
const STAMPS: Partial<Record<QuoteMove, 'acceptedAt' | 'declinedAt'>> = { accept: 'acceptedAt', decline: 'declinedAt' }

export function defineQuoteMove(move: 'accept' | 'decline' | 'start' | 'complete' | 'cancel') {
  return defineEventHandler(async (event: H3Event) => {
    const actor = await requireActor(event)
    const { id } = readParamsWith(event, idParams)
    const quote = findVisibleQuote(actor, id)
    if (move === 'accept' || move === 'decline') requireQuoteCustomer(actor, quote)
    else requireQuoteWriter(actor)
    const stamp = STAMPS[move]
    const row = useDb().transaction(tx => moveQuote(tx, quote, move, actor.id, stamp ? { [stamp]: new Date() } : {}))
    return quoteDetail(row)
  })
}
