import { describe, expect, it } from 'vitest'
import {
  QUOTE_STATES, addDaysUtc, canMoveQuote, divideRoundHalfAway, hasAtMostTwoDecimals, isQuoteEditable,
  isQuotePastValidity, lineAmountCents, nextQuoteState, percentOfCents, quoteTotals, refusedMoveMessage,
  type QuoteMove, type QuoteState,
} from '../../../shared/utils/quotes'

describe('quote money (integer minor units, half away from zero)', () => {
  it('rounds an exact half away from zero, both signs', () => {
    expect(divideRoundHalfAway(15, 10)).toBe(2)
    expect(divideRoundHalfAway(25, 10)).toBe(3)
    expect(divideRoundHalfAway(-15, 10)).toBe(-2)
    expect(divideRoundHalfAway(14, 10)).toBe(1)
    expect(divideRoundHalfAway(-14, 10)).toBe(-1)
  })

  it('prices a line as quantity × unit price without float drift', () => {
    // 1.005 × 100 is 100.49999… in binary floating point; in hundredths it is exactly 100.5 → 101.
    expect(lineAmountCents({ quantity: 1.01, unitPriceCents: 50 })).toBe(51) // 50.5 → 51
    expect(lineAmountCents({ quantity: 2.5, unitPriceCents: 8500 })).toBe(21_250) // 2.5 h of labour
    expect(lineAmountCents({ quantity: 0.35, unitPriceCents: 3333 })).toBe(1167) // 1166.55 → 1167
    expect(lineAmountCents({ quantity: 0.15, unitPriceCents: 10 })).toBe(2) // 1.5 → 2
  })

  it('takes tax once on the subtotal, not per line', () => {
    // Three lines of 0.05 € at 10 %: per line the tax would be 3 × 0.5 → 3 × 1 = 3 cents; on the
    // subtotal it is 15 × 10 % = 1.5 → 2 cents. We round on the subtotal.
    const totals = quoteTotals([
      { quantity: 1, unitPriceCents: 5 },
      { quantity: 1, unitPriceCents: 5 },
      { quantity: 1, unitPriceCents: 5 },
    ], 10, 30)
    expect(totals.subtotalCents).toBe(15)
    expect(totals.taxCents).toBe(2)
    expect(totals.totalCents).toBe(17)
    expect(totals.depositCents).toBe(5) // 17 × 30 % = 5.1 → 5
  })

  it('adds up a typical front-mount quote', () => {
    const totals = quoteTotals([
      { quantity: 1, unitPriceCents: 64_000 }, // core
      { quantity: 2.4, unitPriceCents: 3_250 }, // pipework per metre → 7 800
      { quantity: 4, unitPriceCents: 1_899 }, // couplers → 7 596
      { quantity: 8, unitPriceCents: 349 }, // clamps → 2 792
      { quantity: 6.5, unitPriceCents: 8_500 }, // labour hours → 55 250
    ], 20, 30)
    expect(totals.lineAmountsCents).toEqual([64_000, 7_800, 7_596, 2_792, 55_250])
    expect(totals.subtotalCents).toBe(137_438)
    expect(totals.taxCents).toBe(27_488) // 27 487.6 → 27 488
    expect(totals.totalCents).toBe(164_926)
    expect(totals.depositCents).toBe(49_478) // 49 477.8 → 49 478
  })

  it('handles rates with two decimals exactly', () => {
    expect(percentOfCents(10_000, 7.7)).toBe(770)
    expect(percentOfCents(333, 8.25)).toBe(27) // 27.4725 → 27
    expect(percentOfCents(200, 12.5)).toBe(25)
    expect(percentOfCents(1, 50)).toBe(1) // 0.5 → 1
  })

  it('recognises values with more than two decimals', () => {
    expect(hasAtMostTwoDecimals(2.25)).toBe(true)
    expect(hasAtMostTwoDecimals(0.1)).toBe(true)
    expect(hasAtMostTwoDecimals(2.255)).toBe(false)
  })
})

describe('quote states', () => {
  it('follows the happy path from draft to completed', () => {
    const path: Array<[QuoteMove, QuoteState]> = [['send', 'sent'], ['accept', 'accepted'], ['pay', 'deposit_paid'], ['start', 'in_progress'], ['complete', 'completed']]
    let state: QuoteState = 'draft'
    for (const [move, expected] of path) {
      const next = nextQuoteState(state, move)
      expect(next).toBe(expected)
      state = next!
    }
  })

  it('refuses paying a declined quote and editing a sent one', () => {
    expect(nextQuoteState('declined', 'pay')).toBeNull()
    expect(refusedMoveMessage('declined', 'pay')).toBe('This quote is declined, so it cannot be paid.')
    expect(isQuoteEditable('sent')).toBe(false)
    expect(isQuoteEditable('draft')).toBe(true)
    expect(nextQuoteState('sent', 'revise')).toBe('draft')
  })

  it('has no way out of completed or cancelled', () => {
    const moves: QuoteMove[] = ['send', 'revise', 'accept', 'decline', 'pay', 'start', 'complete', 'cancel', 'expire']
    for (const end of ['completed', 'cancelled'] as const) {
      for (const move of moves) expect(canMoveQuote(end, move)).toBe(false)
    }
  })

  it('does not cancel work once the deposit is paid', () => {
    expect(canMoveQuote('deposit_paid', 'cancel')).toBe(false)
    expect(canMoveQuote('in_progress', 'cancel')).toBe(false)
    expect(refusedMoveMessage('deposit_paid', 'cancel')).toBe('A deposit has been paid on this quote: settle the refund with the customer first; Densitas does not cancel paid work.')
  })

  it('says "already" for a move to the state the quote is in, not "cannot be"', () => {
    expect(refusedMoveMessage('completed', 'complete')).toBe('This quote is already completed.')
    expect(refusedMoveMessage('cancelled', 'cancel')).toBe('This quote is already cancelled.')
    expect(refusedMoveMessage('completed', 'cancel')).toBe('This quote is completed, so it cannot be cancelled.')
  })

  it('lets only the customer-facing states expire, after their last valid day', () => {
    expect(isQuotePastValidity({ status: 'sent', validUntil: '2026-03-01' }, '2026-03-01')).toBe(false)
    expect(isQuotePastValidity({ status: 'sent', validUntil: '2026-03-01' }, '2026-03-02')).toBe(true)
    expect(isQuotePastValidity({ status: 'accepted', validUntil: '2026-03-01' }, '2026-03-02')).toBe(true)
    for (const status of QUOTE_STATES.filter(s => s !== 'sent' && s !== 'accepted')) {
      expect(isQuotePastValidity({ status, validUntil: '2026-03-01' }, '2026-03-02')).toBe(false)
    }
    expect(isQuotePastValidity({ status: 'sent', validUntil: null }, '2099-01-01')).toBe(false)
  })

  it('adds calendar days across a month end', () => {
    expect(addDaysUtc('2026-01-31', 30)).toBe('2026-03-02')
  })
})
