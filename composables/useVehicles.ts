import type { CoreView } from '#shared/types/cores'

export function useVehicles() {
  return useFetch('/api/vehicles', { key: 'vehicles', default: () => [] })
}

export function useVehicle(id: MaybeRefOrGetter<number>) {
  return useFetch(() => `/api/vehicles/${toValue(id)}`, { key: `vehicle-${toValue(id)}` })
}

export function useCustomers() {
  return useFetch('/api/members', { key: 'members', default: () => [] })
}

export function useCores() {
  return useFetch<CoreView[]>('/api/cores', { key: 'cores', default: () => [] })
}
