/**
 * The search box of a list the server pages: typing waits a moment before asking the server, and a
 * new search starts again at page 1. Returns the box's text; the query gets `q` once typing stops.
 */
export function useSearchQuery(query: { q?: string, page: number }, delayMs = 250) {
  const search = ref(query.q ?? '')
  let timer: ReturnType<typeof setTimeout> | undefined
  watch(search, (text) => {
    clearTimeout(timer)
    timer = setTimeout(() => {
      query.q = text
      query.page = 1
    }, delayMs)
  })
  onBeforeUnmount(() => clearTimeout(timer))
  return search
}
