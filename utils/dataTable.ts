// Types of the one table component (components/ui/UiDataTable.vue), kept outside the SFC so pages
// can declare their columns with them.

export interface DataSort<SortKey extends string = string> {
  key: SortKey
  dir: 'asc' | 'desc'
}

export interface DataColumn<Row, SortKey extends string = string> {
  /** Slot name suffix (`cell-<key>`) and, without `value`, the row field shown. */
  key: string
  label: string
  /** A fixed key emitted when the header is clicked; no key, no sorting. */
  sortKey?: SortKey
  /** Direction of the first click (numbers where "most" matters start descending). */
  firstDir?: 'asc' | 'desc'
  /** How the phone's sort menu words the two directions: A to Z, lowest first, oldest first. */
  sortKind?: 'text' | 'number' | 'date'
  align?: 'left' | 'right'
  value?: (row: Row) => string
  class?: string
  headerClass?: string
  /** The header is for screen readers only (an actions column). */
  hideLabel?: boolean
}

/** Sort rows in the browser by a fixed key (for lists that arrive whole). Nulls go last either way. */
export function sortRows<Row, SortKey extends string>(rows: readonly Row[], sort: DataSort<SortKey> | null, pick: (row: Row, key: SortKey) => number | string | null | undefined, tieBreak?: (a: Row, b: Row) => number): Row[] {
  if (!sort) return [...rows]
  const sign = sort.dir === 'asc' ? 1 : -1
  return [...rows].sort((a, b) => {
    const x = pick(a, sort.key)
    const y = pick(b, sort.key)
    if (x == null && y == null) return tieBreak?.(a, b) ?? 0
    if (x == null) return 1
    if (y == null) return -1
    const order = typeof x === 'number' && typeof y === 'number' ? x - y : String(x).localeCompare(String(y))
    return order * sign || (tieBreak?.(a, b) ?? 0)
  })
}

const SORT_WORDS = {
  text: { asc: 'A to Z', desc: 'Z to A' },
  number: { asc: 'lowest first', desc: 'highest first' },
  date: { asc: 'oldest first', desc: 'newest first' },
} as const

/** The phone's sort menu (its headers are hidden): each sortable column in both directions. */
export function sortChoices<Row, SortKey extends string>(columns: readonly DataColumn<Row, SortKey>[]) {
  return columns.flatMap((column) => {
    if (!column.sortKey) return []
    const words = SORT_WORDS[column.sortKind ?? 'text']
    const first = column.firstDir ?? 'asc'
    const dirs = first === 'asc' ? (['asc', 'desc'] as const) : (['desc', 'asc'] as const)
    return dirs.map(dir => ({ value: `${column.sortKey}:${dir}`, label: `${column.label}, ${words[dir]}`, sort: { key: column.sortKey!, dir } as DataSort<SortKey> }))
  })
}

/** Whether a row's text holds every word typed (any order, any case). */
export function matchesSearch(text: string, search: string) {
  const words = search.toLocaleLowerCase().split(/\s+/).filter(Boolean)
  if (!words.length) return true
  const haystack = text.toLocaleLowerCase()
  return words.every(word => haystack.includes(word))
}

export interface RowsViewOptions<Row, SortKey extends string> {
  search: string
  /** Everything a person might type to find the row, as one string. */
  text: (row: Row) => string
  sort: DataSort<SortKey> | null
  pick: (row: Row, key: SortKey) => number | string | null | undefined
  tieBreak?: (a: Row, b: Row) => number
  page: number
  pageSize: number
}

/** Search, sort and page a list that arrived whole (client-side paging). The page is kept in range. */
export function viewRows<Row, SortKey extends string>(rows: readonly Row[], options: RowsViewOptions<Row, SortKey>) {
  const found = rows.filter(row => matchesSearch(options.text(row), options.search))
  const sorted = sortRows(found, options.sort, options.pick, options.tieBreak)
  const pageCount = Math.max(1, Math.ceil(sorted.length / options.pageSize))
  const page = Math.min(Math.max(1, Math.floor(options.page) || 1), pageCount)
  const start = (page - 1) * options.pageSize
  return { rows: sorted.slice(start, start + options.pageSize), total: sorted.length, page }
}
