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
