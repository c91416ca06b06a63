// The quote form's draft and its conversion to and from what the API takes (whole cents).
// A quote line as the form edits it: prices in major units (12.50), as people type them.
export interface QuoteLineDraft {
  description: string
  quantity: number | null
  unitPrice: number | null
}

export interface QuoteDraft {
  vehicleId: number | null
  coreId: number | null
  sizingId: number | null
  lines: QuoteLineDraft[]
  taxRatePct: number
  depositPct: number
  validUntil: string
  terms: string
}

// Whole cents when the price has at most two decimals; otherwise the raw value goes to the server,
// which refuses it with a message (no silent rounding of what was typed).
export function priceToCents(price: number | null) {
  if (price == null) return 0
  const cents = price * 100
  return Math.abs(cents - Math.round(cents)) < 1e-6 ? Math.round(cents) : cents
}

export function draftLinesToBody(lines: QuoteLineDraft[]) {
  return lines.map(l => ({ description: l.description, quantity: l.quantity ?? 0, unitPriceCents: priceToCents(l.unitPrice) }))
}

export function linesToDraft(lines: Array<{ description: string, quantity: number, unitPriceCents: number }>): QuoteLineDraft[] {
  return lines.map(l => ({ description: l.description, quantity: l.quantity, unitPrice: l.unitPriceCents / 100 }))
}
