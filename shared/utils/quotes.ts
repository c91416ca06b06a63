// The rules of a quote in one place, pure so the server (authoritative) and the page (live totals,
// which buttons to show) use the same code: the state machine and the money arithmetic.

export const QUOTE_STATES = ['draft', 'sent', 'accepted', 'deposit_paid', 'in_progress', 'completed', 'declined', 'expired', 'cancelled'] as const
export type QuoteState = typeof QUOTE_STATES[number]

// Fixed keys the quote lists can be sorted by (the server maps each to its column) and page sizes.
export const QUOTE_SORT_KEYS = ['number', 'car', 'status', 'validUntil', 'total'] as const
export type QuoteSortKey = typeof QUOTE_SORT_KEYS[number]
export const QUOTE_PAGE_SIZES = [10, 25, 50, 100] as const

export const QUOTE_STATE_LABELS: Record<QuoteState, string> = {
  draft: 'Draft',
  sent: 'Sent',
  accepted: 'Accepted',
  deposit_paid: 'Deposit paid',
  in_progress: 'In progress',
  completed: 'Completed',
  declined: 'Declined',
  expired: 'Expired',
  cancelled: 'Cancelled',
}

// The usual cautions, on every quote (page and PDF): the work is real fabrication on a road car.
export const QUOTE_CAUTIONS = [
  'Fabrication, cutting of the bumper and any bracket work follow the car maker\'s instructions and local codes and road-legality rules; check clearance, radiator and condenser airflow and the crash structure before cutting.',
  'The charge system is pressure-tested on a proper test rig, within the ratings of its parts, before the car goes back on the road.',
  'Any cooling figures quoted are estimates from a log and a model, to be confirmed by a log after fitting.',
]

export type QuoteMove = 'send' | 'revise' | 'accept' | 'decline' | 'pay' | 'start' | 'complete' | 'cancel' | 'expire'

// Every legal move: from which states, to which state. Anything not listed is refused (409).
const MOVES: Record<QuoteMove, { from: readonly QuoteState[], to: QuoteState }> = {
  send: { from: ['draft'], to: 'sent' },
  // Changing a quote the customer has seen takes it back to draft as a new revision.
  revise: { from: ['sent', 'declined', 'expired'], to: 'draft' },
  accept: { from: ['sent'], to: 'accepted' },
  decline: { from: ['sent'], to: 'declined' },
  pay: { from: ['accepted'], to: 'deposit_paid' },
  start: { from: ['deposit_paid'], to: 'in_progress' },
  complete: { from: ['in_progress'], to: 'completed' },
  // Once a deposit is paid, calling the job off means a refund, which is settled outside Densitas.
  cancel: { from: ['draft', 'sent', 'accepted', 'declined', 'expired'], to: 'cancelled' },
  expire: { from: ['sent', 'accepted'], to: 'expired' },
}

const MOVE_WORDS: Record<QuoteMove, string> = {
  send: 'sent',
  revise: 'revised',
  accept: 'accepted',
  decline: 'declined',
  pay: 'paid',
  start: 'started',
  complete: 'marked completed',
  cancel: 'cancelled',
  expire: 'expired',
}

export function nextQuoteState(from: QuoteState, move: QuoteMove): QuoteState | null {
  const rule = MOVES[move]
  return rule.from.includes(from) ? rule.to : null
}

export function canMoveQuote(from: QuoteState, move: QuoteMove) {
  return nextQuoteState(from, move) !== null
}

// Only a draft is edited in place.
export const isQuoteEditable = (state: QuoteState) => state === 'draft'

// What a person reads when a move is refused.
export function refusedMoveMessage(from: QuoteState, move: QuoteMove): string {
  const state = QUOTE_STATE_LABELS[from].toLowerCase()
  if (move === 'pay' && from === 'sent') return 'Accept the quote before paying the deposit.'
  if (move === 'pay' && from === 'deposit_paid') return 'The deposit on this quote is already paid.'
  if (move === 'cancel' && (from === 'deposit_paid' || from === 'in_progress')) return 'A deposit has been paid on this quote: settle the refund with the customer first; Densitas does not cancel paid work.'
  if (MOVES[move].to === from) return `This quote is already ${state}.`
  return `This quote is ${state}, so it cannot be ${MOVE_WORDS[move]}.`
}

// A quote stays valid through the whole of its valid-until day (UTC dates, YYYY-MM-DD).
export function isQuotePastValidity(quote: { status: QuoteState, validUntil: string | null }, today: string) {
  return quote.validUntil !== null && quote.validUntil < today && canMoveQuote(quote.status, 'expire')
}

export function todayUtc(now = new Date()) {
  return now.toISOString().slice(0, 10)
}

export function addDaysUtc(date: string, days: number) {
  const d = new Date(`${date}T00:00:00Z`)
  d.setUTCDate(d.getUTCDate() + days)
  return d.toISOString().slice(0, 10)
}

// ---- money --------------------------------------------------------------------------------------
// Amounts are integers in the currency's minor unit (cents). Quantities and percentages carry at
// most two decimals, so every product below is an exact integer before the one division, and each
// rounding is explicit: half away from zero (1.5 → 2, 2.5 → 3, −1.5 → −2).
//   line amount = quantity × unit price, rounded per line;
//   tax         = subtotal × rate, rounded once on the quote's subtotal (not per line);
//   total       = subtotal + tax;  deposit = total × deposit share, rounded once.

export interface QuoteLineInput {
  description: string
  quantity: number
  unitPriceCents: number
}

export interface QuoteTotals {
  lineAmountsCents: number[]
  subtotalCents: number
  taxCents: number
  totalCents: number
  depositCents: number
}

// Integer numerator ÷ positive integer divisor, rounded half away from zero, without floats.
export function divideRoundHalfAway(numerator: number, divisor: number) {
  const sign = numerator < 0 ? -1 : 1
  const n = Math.abs(numerator)
  const q = Math.floor(n / divisor)
  const r = n - q * divisor
  return sign * (2 * r >= divisor ? q + 1 : q)
}

// 2.5 → 250: a value with at most two decimals as an exact integer in hundredths.
export function toHundredths(value: number) {
  return Math.round(value * 100)
}

export function hasAtMostTwoDecimals(value: number) {
  return Math.abs(value * 100 - Math.round(value * 100)) < 1e-6
}

export function lineAmountCents(line: Pick<QuoteLineInput, 'quantity' | 'unitPriceCents'>) {
  return divideRoundHalfAway(toHundredths(line.quantity) * line.unitPriceCents, 100)
}

// pct with two decimals → basis points (hundredths of a percent); amount × bp ÷ 10 000.
export function percentOfCents(amountCents: number, pct: number) {
  return divideRoundHalfAway(amountCents * toHundredths(pct), 10_000)
}

export function quoteTotals(lines: ReadonlyArray<Pick<QuoteLineInput, 'quantity' | 'unitPriceCents'>>, taxRatePct: number, depositPct: number): QuoteTotals {
  const lineAmountsCents = lines.map(lineAmountCents)
  const subtotalCents = lineAmountsCents.reduce((sum, cents) => sum + cents, 0)
  const taxCents = percentOfCents(subtotalCents, taxRatePct)
  const totalCents = subtotalCents + taxCents
  return { lineAmountsCents, subtotalCents, taxCents, totalCents, depositCents: percentOfCents(totalCents, depositPct) }
}
