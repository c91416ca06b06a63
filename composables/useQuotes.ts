import type { QuoteState } from '#shared/utils/quotes'

export function useQuotes(filter: MaybeRefOrGetter<{ vehicleId?: number, status?: QuoteState }> = {}) {
  return useFetch('/api/quotes', { query: computed(() => toValue(filter)), default: () => [] })
}

export function useQuote(id: MaybeRefOrGetter<number>) {
  return useFetch(() => `/api/quotes/${toValue(id)}`, { key: `quote-${toValue(id)}` })
}
