import { viewRows, type DataSort } from '~/utils/dataTable'

interface TableViewOptions<Row, SortKey extends string> {
  text: (row: Row) => string
  pick: (row: Row, key: SortKey) => number | string | null | undefined
  tieBreak?: (a: Row, b: Row) => number
  sort?: DataSort<SortKey> | null
  pageSize?: number
}

// Search, sort and pages in the browser for a list that arrives whole (a car's dyno runs, the pulls
// of a comparison), bound to UiDataTable with v-model:search, v-model:sort and v-model:page.
// Lists that can grow without end (outbox, quotes, catalogue) page on the server instead.
export function useTableView<Row, SortKey extends string>(rows: MaybeRefOrGetter<readonly Row[]>, options: TableViewOptions<Row, SortKey>) {
  const search = ref('')
  const sort = ref<DataSort<SortKey> | null>(options.sort ?? null) as Ref<DataSort<SortKey> | null>
  const wanted = ref(1)
  const pageSize = options.pageSize ?? 10
  // A new search or order starts from the first page.
  watch([search, sort], () => {
    wanted.value = 1
  })
  const view = computed(() => viewRows(toValue(rows), { search: search.value, text: options.text, sort: sort.value, pick: options.pick, tieBreak: options.tieBreak, page: wanted.value, pageSize }))
  const page = computed({
    get: () => view.value.page,
    set: (next: number) => {
      wanted.value = next
    },
  })
  // reactive, so a template binds `table.search` without `.value`.
  return reactive({ search, sort, page, pageSize, rows: computed(() => view.value.rows), total: computed(() => view.value.total) })
}
