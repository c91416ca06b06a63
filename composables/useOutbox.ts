import type { MailDelivery } from '#shared/utils/outbox'

// One page of the workshop's outbox (newest first), refetched when the page or the filter changes.
export function useOutbox(page: Ref<number>, status: Ref<MailDelivery['status'] | ''>) {
  return useFetch('/api/outbox', {
    key: 'outbox',
    query: computed(() => ({ page: page.value, limit: OUTBOX_PAGE_SIZE, status: status.value || undefined })),
    default: () => [],
  })
}

export function useMailDelivery() {
  return useFetch('/api/outbox/delivery', { key: 'outbox-delivery' })
}
