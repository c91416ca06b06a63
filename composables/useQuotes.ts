import type { QuoteSortKey, QuoteState } from '#shared/utils/quotes'

export interface QuoteListQuery {
  vehicleId?: number
  status?: QuoteState
  q: string
  sort: QuoteSortKey
  dir: 'asc' | 'desc'
  page: number
  pageSize: number
}

export interface QuoteListItem {
  id: number
  number: string
  status: QuoteState
  currency: string
  totalCents: number
  validUntil: string | null
  vehicle: { id: number, description: string, registration: string | null }
  customer: { id: number, name: string }
}

export interface QuotePage { items: QuoteListItem[], total: number, page: number, pageSize: number }

// One page of a quote table (the workshop's, or one car's), refetched when the query changes.
export function useQuotePage(query: MaybeRefOrGetter<QuoteListQuery>) {
  return useFetch<QuotePage>('/api/quotes', {
    key: `quote-page-${toValue(query).vehicleId ?? 'all'}`,
    query: computed(() => {
      const q = toValue(query)
      return { ...q, q: q.q.trim() || undefined }
    }),
  })
}

export function useQuote(id: MaybeRefOrGetter<number>) {
  return useFetch(() => `/api/quotes/${toValue(id)}`, { key: `quote-${toValue(id)}` })
}
