import { mountSuspended } from '@nuxt/test-utils/runtime'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h, nextTick, reactive } from 'vue'
import { useSearchQuery } from '~/composables/useSearchQuery'

describe('useSearchQuery', () => {
  afterEach(() => {
    vi.useRealTimers()
  })

  it('asks the server once typing stops, and starts the new search at page 1', async () => {
    vi.useFakeTimers()
    const query = reactive({ q: '', page: 3 })
    let search!: ReturnType<typeof useSearchQuery>
    await mountSuspended(defineComponent({
      setup() {
        search = useSearchQuery(query)
        return () => h('div')
      },
    }))
    search.value = 'Q-2'
    await nextTick()
    search.value = 'Q-2026'
    await nextTick()
    vi.advanceTimersByTime(200)
    expect(query).toEqual({ q: '', page: 3 })
    vi.advanceTimersByTime(60)
    expect(query).toEqual({ q: 'Q-2026', page: 1 })
  })
})
