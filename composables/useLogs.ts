import type { InternalApi } from 'nitropack/types'
import type { AnalysisResult, LogProfile, ShareLink } from '#shared/types/report'

// What the log routes reply, as the routes build it (serialised: dates as strings); no hand-kept copy.
export type LogListItem = InternalApi['/api/logs']['get'][number]
export type LogDetail = InternalApi['/api/logs/:id']['get']

export function useLogs(vehicleId?: MaybeRefOrGetter<number | null | undefined>) {
  return useFetch<LogListItem[]>('/api/logs', {
    key: `logs-${toValue(vehicleId) ?? 'all'}`,
    query: computed(() => (toValue(vehicleId) ? { vehicleId: toValue(vehicleId) } : {})),
    default: () => [],
  })
}

export function useLog(id: MaybeRefOrGetter<number>) {
  return useFetch<LogDetail>(() => `/api/logs/${toValue(id)}`, { key: `log-${toValue(id)}` })
}

export function useLogAnalysis(id: MaybeRefOrGetter<number>) {
  return useFetch<AnalysisResult>(() => `/api/logs/${toValue(id)}/analysis`, { key: `log-analysis-${toValue(id)}` })
}

export function useLogProfiles(enabled: MaybeRefOrGetter<boolean> = true) {
  return useFetch<LogProfile[]>('/api/log-profiles', { key: 'log-profiles', default: () => [], immediate: toValue(enabled) })
}

export function useShareLinks(id: MaybeRefOrGetter<number>, enabled: MaybeRefOrGetter<boolean>) {
  return useFetch<ShareLink[]>(() => `/api/logs/${toValue(id)}/shares`, { key: `log-shares-${toValue(id)}`, default: () => [], immediate: toValue(enabled) })
}
