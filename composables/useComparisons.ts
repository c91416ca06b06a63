import type { ComparisonDetail, ComparisonListItem, CoreEvidence, DynoComparisonReply, DynoRun, LogChoice } from '#shared/types/comparison'

export function useComparisons(vehicleId: MaybeRefOrGetter<number>) {
  return useFetch<ComparisonListItem[]>('/api/comparisons', {
    key: `comparisons-${toValue(vehicleId)}`,
    query: computed(() => ({ vehicleId: toValue(vehicleId) })),
    default: () => [],
  })
}

export function useComparison(id: MaybeRefOrGetter<number>) {
  return useFetch<ComparisonDetail>(() => `/api/comparisons/${toValue(id)}`, { key: `comparison-${toValue(id)}` })
}

export function useDynoRuns(vehicleId: MaybeRefOrGetter<number>) {
  return useFetch<DynoRun[]>(() => `/api/vehicles/${toValue(vehicleId)}/dyno-runs`, { key: `dyno-runs-${toValue(vehicleId)}`, default: () => [] })
}

export function useDynoComparison(vehicleId: MaybeRefOrGetter<number>, standard: MaybeRefOrGetter<string | undefined>) {
  return useFetch<DynoComparisonReply>(() => `/api/vehicles/${toValue(vehicleId)}/dyno-comparison`, {
    key: `dyno-comparison-${toValue(vehicleId)}`,
    query: computed(() => (toValue(standard) ? { standard: toValue(standard) } : {})),
  })
}

export function useCoreEvidence(id: MaybeRefOrGetter<number>) {
  return useFetch<CoreEvidence>(() => `/api/cores/${toValue(id)}/evidence`, { key: `core-evidence-${toValue(id)}` })
}

export function useLogCore(id: MaybeRefOrGetter<number>) {
  return useFetch<{ core: { id: number, name: string, kind: string } | null }>(() => `/api/logs/${toValue(id)}/core`, { key: `log-core-${toValue(id)}` })
}

export function useLogChoices(vehicleId: MaybeRefOrGetter<number>, enabled: MaybeRefOrGetter<boolean> = true) {
  return useFetch<LogChoice[]>(() => `/api/vehicles/${toValue(vehicleId)}/log-choices`, { key: `log-choices-${toValue(vehicleId)}`, default: () => [], immediate: toValue(enabled) })
}
