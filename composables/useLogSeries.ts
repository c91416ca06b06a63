import type { ChannelId, DownsampleResult } from '#shared/types/report'

export interface SeriesWindow { fromS: number, toS: number }

// The channels the time chart draws (ids of the channel catalogue, so a renamed one fails the type check).
const CHART_CHANNELS: readonly ChannelId[] = ['chargeTemp', 'preCoolerTemp', 'ambientTemp', 'manifoldPressure', 'rpm']
const CHANNELS = CHART_CHANNELS.join(',')
const OVERVIEW_POINTS = 1500
const DETAIL_POINTS = 1500
// A window this close to the whole log gains nothing from a detail fetch.
const FULL_WIDTH = 0.98

// The time chart's data: a thinned-out overview of the whole log, and the zoomed window at full
// detail. The key follows the window, so a zoom fetches once and going back is served from cache.
// Fetched in the browser only (the chart draws there), as before.
export function useLogSeries(url: MaybeRefOrGetter<string>, enabled: MaybeRefOrGetter<boolean> = true) {
  const window = ref<SeriesWindow | null>(null)
  const overview = useAsyncData(
    () => `series-${toValue(url)}`,
    async () => toValue(enabled) ? await $fetch<DownsampleResult>(toValue(url), { query: { channels: CHANNELS, points: OVERVIEW_POINTS } }) : null,
    { server: false, watch: [() => toValue(enabled)] },
  )
  const needsDetail = computed(() => {
    const full = overview.data.value
    const w = window.value
    return Boolean(full && w && w.toS - w.fromS < (full.toS - full.fromS) * FULL_WIDTH)
  })
  const detail = useAsyncData(
    () => needsDetail.value ? `series-${toValue(url)}-${window.value!.fromS}-${window.value!.toS}` : `series-${toValue(url)}-whole`,
    async () => needsDetail.value && window.value
      ? await $fetch<DownsampleResult>(toValue(url), { query: { channels: CHANNELS, from: window.value.fromS, to: window.value.toS, points: DETAIL_POINTS } })
      : null,
    { server: false },
  )
  return reactive({
    overview: computed(() => overview.data.value ?? null),
    detail: computed(() => detail.data.value ?? null),
    window: readonly(window),
    loadingDetail: computed(() => detail.status.value === 'pending'),
    error: computed(() => {
      const failed = overview.error.value ?? detail.error.value
      return failed ? apiErrorMessage(failed) : ''
    }),
    setWindow: (next: SeriesWindow | null) => { window.value = next },
  })
}

export type LogSeries = ReturnType<typeof useLogSeries>
