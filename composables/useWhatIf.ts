import type { WhatIfResult } from '#shared/types/report'

// The "another day" figures for one outside-air temperature. The slider moves freely; the request
// waits until it rests for a moment, and the key follows the temperature asked for.
export function useWhatIf(url: MaybeRefOrGetter<string>, enabled: MaybeRefOrGetter<boolean> = true) {
  const ambientC = ref(35)
  const asked = ref(ambientC.value)
  let timer: ReturnType<typeof setTimeout> | undefined
  watch(ambientC, (value) => {
    clearTimeout(timer)
    timer = setTimeout(() => {
      asked.value = value
    }, 200)
  })
  if (getCurrentInstance()) onBeforeUnmount(() => clearTimeout(timer))
  const { data, status, error } = useAsyncData(
    () => `what-if-${toValue(url)}-${asked.value}`,
    async () => toValue(enabled) ? await $fetch<WhatIfResult>(toValue(url), { query: { ambientC: asked.value } }) : null,
    { server: false, watch: [() => toValue(enabled)] },
  )
  // Keep the last figures on screen while the next ones load (they are shown dimmed).
  const shown = shallowRef<WhatIfResult | null>(null)
  watch(data, (next) => {
    if (next) shown.value = next
  }, { immediate: true })
  return reactive({
    ambientC,
    result: shown,
    loading: computed(() => status.value === 'pending'),
    error: computed(() => error.value ? apiErrorMessage(error.value) : ''),
    setAmbientC: (value: number) => { ambientC.value = value },
  })
}

export type WhatIf = ReturnType<typeof useWhatIf>
