import type { MailDelivery, OutboxSortKey } from '#shared/utils/outbox'

export interface OutboxQuery {
  page: number
  status: MailDelivery['status'] | ''
  q: string
  sort: OutboxSortKey
  dir: 'asc' | 'desc'
}

// One page of the workshop's outbox, refetched when the query changes. The route answers the rows
// and says how many there are in X-Total-Count; that count is kept in state so it survives the
// hand-over from the server's render to the browser.
export async function useOutbox(query: MaybeRefOrGetter<OutboxQuery>) {
  const total = useState('outbox-total', () => 0)
  const reply = await useFetch('/api/outbox', {
    key: 'outbox',
    query: computed(() => {
      const { page, status, q, sort, dir } = toValue(query)
      return { page, limit: OUTBOX_PAGE_SIZE, status: status || undefined, q: q.trim() || undefined, sort, dir }
    }),
    default: () => [],
    onResponse({ response }) {
      if (response.ok) total.value = Number(response.headers.get('x-total-count') ?? 0)
    },
  })
  return { ...reply, total }
}

export function useMailDelivery() {
  return useFetch('/api/outbox/delivery', { key: 'outbox-delivery' })
}
