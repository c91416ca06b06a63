import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import QuoteForm from '~/components/quote/QuoteForm.vue'
import QuoteTotals from '~/components/quote/QuoteTotals.vue'
import type { QuoteDraft } from '~/utils/quoteDraft'

// What the fabricator and the customer read under a quote's lines: each figure with its label.
function readTotals(wrapper: { find: (selector: string) => { findAll: (selector: string) => Array<{ text: () => string }> } }) {
  const cells = wrapper.find('[data-testid="quote-totals"]').findAll('dt, dd').map(cell => cell.text().replace(/\s+/g, ' '))
  const rows: Array<[string, string]> = []
  for (let i = 0; i < cells.length; i += 2) rows.push([cells[i]!, cells[i + 1]!])
  return rows
}

describe('QuoteTotals', () => {
  it('reads subtotal, tax, total, deposit and the balance left for completion, in the quote\'s currency', async () => {
    // Worked by hand: 1 193.50 + 21 % tax 250.64 = 1 444.14; 30 % deposit 433.24; balance 1 010.90.
    const wrapper = await mountSuspended(QuoteTotals, {
      props: { totals: { subtotalCents: 119_350, taxCents: 25_064, totalCents: 144_414, depositCents: 43_324 }, taxRatePct: 21, depositPct: 30, currency: 'EUR' },
    })
    expect(readTotals(wrapper)).toEqual([
      ['Subtotal', '€1,193.50'],
      ['Tax (21 %)', '€250.64'],
      ['Total', '€1,444.14'],
      ['Deposit (30 %)', '€433.24'],
      ['Balance on completion', '€1,010.90'],
    ])
  })
})

describe('QuoteForm totals', () => {
  it('totals the lines as they are typed: each line to the cent, tax once on the subtotal, half away from zero', async () => {
    // Worked by hand:
    //   core        1   × 845.50 = 845.50
    //   pipework    2.5 × 38.40  =  96.00
    //   labour      3.5 × 72.00  = 252.00
    //   subtotal                  1 193.50
    //   tax 21 %   1 193.50 × 0.21 = 250.635 → 250.64 (half away from zero)
    //   total                     1 444.14
    //   deposit 30 %  1 444.14 × 0.30 = 433.242 → 433.24;  balance 1 444.14 − 433.24 = 1 010.90
    const draft: QuoteDraft = {
      vehicleId: 1, coreId: null, sizingId: null, validUntil: '', terms: '', taxRatePct: 21, depositPct: 30,
      lines: [
        { description: 'Core: Compact front-mount 550', quantity: 1, unitPrice: 845.5 },
        { description: 'Charge pipework, per metre', quantity: 2.5, unitPrice: 38.4 },
        { description: 'Labour, hours', quantity: 3.5, unitPrice: 72 },
      ],
    }
    const wrapper = await mountSuspended(QuoteForm, {
      props: { 'modelValue': draft, 'onUpdate:modelValue': () => {}, 'cores': [], 'currency': 'EUR', 'labourRateCents': 7200, 'submitLabel': 'Save draft' },
    })
    expect(readTotals(wrapper)).toEqual([
      ['Subtotal', '€1,193.50'],
      ['Tax (21 %)', '€250.64'],
      ['Total', '€1,444.14'],
      ['Deposit (30 %)', '€433.24'],
      ['Balance on completion', '€1,010.90'],
    ])
  })

  it('reads nothing owed for a quote with no priced lines yet', async () => {
    const draft: QuoteDraft = { vehicleId: 1, coreId: null, sizingId: null, validUntil: '', terms: '', taxRatePct: 20, depositPct: 25, lines: [{ description: 'Bumper modification', quantity: 1, unitPrice: null }] }
    const wrapper = await mountSuspended(QuoteForm, {
      props: { 'modelValue': draft, 'onUpdate:modelValue': () => {}, 'cores': [], 'currency': 'GBP', 'labourRateCents': 6000, 'submitLabel': 'Save draft' },
    })
    expect(readTotals(wrapper).map(([label, value]) => `${label}: ${value}`)).toEqual([
      'Subtotal: £0.00', 'Tax (20 %): £0.00', 'Total: £0.00', 'Deposit (25 %): £0.00', 'Balance on completion: £0.00',
    ])
  })
})
