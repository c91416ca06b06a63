import type { CorePage, CoreView } from '#shared/types/cores'
import type { CoreSortKey } from '#shared/utils/cores'

export interface CatalogueQuery {
  q: string
  sort: CoreSortKey
  dir: 'asc' | 'desc'
  status: 'active' | 'retired' | 'all'
  page: number
  pageSize: number
}

// One page of the catalogue table; refetches when the query changes.
export function useCataloguePage(query: MaybeRefOrGetter<CatalogueQuery>) {
  return useFetch<CorePage>('/api/cores', {
    key: 'core-catalogue-page',
    query: computed(() => {
      const q = toValue(query)
      return { ...q, q: q.q.trim() || undefined }
    }),
  })
}

export function useCore(id: MaybeRefOrGetter<number>) {
  return useFetch<CoreView>(() => `/api/cores/${toValue(id)}`, { key: `core-${toValue(id)}` })
}

export interface SizingOptions {
  vehicle: { id: number, description: string, fittedCoreId: number | null, ratedPowerKw: number | null }
  logs: Array<{
    id: number
    originalName: string
    recordedOn: string | null
    createdAt: string
    coreId: number | null
    coreFromCar: boolean
    pullCount: number
    meanEffectiveness: number | null
    effectivenessSource: 'measured' | 'estimated' | null
    ambientTempC: number | null
  }>
  cores: CoreView[]
  logCores: CoreView[]
}

export function useSizingOptions(vehicleId: MaybeRefOrGetter<number>) {
  return useFetch<SizingOptions>('/api/sizing/options', { key: `sizing-options-${toValue(vehicleId)}`, query: computed(() => ({ vehicleId: toValue(vehicleId) })) })
}

// Every active core as one list, for the pickers (fitted core, core of a log, quote lines).
export function useCoreChoices(enabled: MaybeRefOrGetter<boolean> = true) {
  return useFetch<CoreView[]>('/api/cores', { key: 'core-choices', default: () => [], immediate: toValue(enabled) })
}
