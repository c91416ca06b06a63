import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import { h, type Component } from 'vue'
import UiDataTable from '~/components/ui/UiDataTable.vue'
import { matchesSearch, sortChoices, sortRows, viewRows, type DataColumn } from '~/utils/dataTable'

interface Row { id: number, name: string, depthMm: number | null }
type Key = 'name' | 'depth'
const rows: Row[] = [
  { id: 1, name: 'Bravo', depthMm: 76 },
  { id: 2, name: 'Alpha', depthMm: null },
  { id: 3, name: 'Charlie', depthMm: 100 },
]
const columns: DataColumn<Row, Key>[] = [
  { key: 'name', label: 'Core', sortKey: 'name' },
  { key: 'depth', label: 'Depth (mm)', sortKey: 'depth', sortKind: 'number', firstDir: 'desc', align: 'right', value: row => (row.depthMm == null ? '—' : String(row.depthMm)) },
  { key: 'notes', label: 'Notes' },
]
// The component is generic over its row; mounting it in a test sees it as a plain component.
const Table = UiDataTable as Component
const base = { columns, rows, rowKey: (row: Row) => row.id, testid: 'things', rowTestid: 'thing-row' }

describe('UiDataTable', () => {
  it('renders one row per item with its cells, and the column name for phones in data-label', async () => {
    const wrapper = await mountSuspended(Table, { props: base })
    const trs = wrapper.findAll('[data-testid="thing-row"]')
    expect(trs).toHaveLength(3)
    expect(trs[0]!.findAll('td').map(td => td.text())).toEqual(['Bravo', '76', '—'])
    expect(trs[0]!.findAll('td')[1]!.attributes('data-label')).toBe('Depth (mm)')
    expect(wrapper.find('th[aria-sort]').exists()).toBe(true)
  })

  it('emits the fixed sort key, flipping the direction on a second click and starting where the column says', async () => {
    const wrapper = await mountSuspended(Table, { props: { ...base, sort: { key: 'name', dir: 'asc' } } })
    await wrapper.find('[data-testid="sort-name"]').trigger('click')
    await wrapper.find('[data-testid="sort-depth"]').trigger('click')
    expect(wrapper.emitted('update:sort')).toEqual([[{ key: 'name', dir: 'desc' }], [{ key: 'depth', dir: 'desc' }]])
    expect(wrapper.find('th[aria-sort="ascending"]').text()).toMatch(/Core/)
    expect(wrapper.find('[data-testid="sort-notes"]').exists()).toBe(false)
  })

  it('shows the empty state instead of a table', async () => {
    const wrapper = await mountSuspended(Table, { props: { ...base, rows: [], emptyText: 'No cores here yet.' } })
    expect(wrapper.find('table').exists()).toBe(false)
    expect(wrapper.find('[data-testid="things-empty"]').text()).toBe('No cores here yet.')
  })

  it('pages: says which rows are shown and emits the next page, with the ends disabled', async () => {
    const wrapper = await mountSuspended(Table, { props: { ...base, page: 1, pageSize: 3, total: 7, noun: 'cores' } })
    expect(wrapper.find('[data-testid="things-pager"]').text()).toMatch(/1–3 of 7 cores.*Page 1 of 3/)
    expect(wrapper.find('[data-testid="page-previous"]').attributes('disabled')).toBeDefined()
    await wrapper.find('[data-testid="page-next"]').trigger('click')
    expect(wrapper.emitted('update:page')).toEqual([[2]])
  })

  it('hides the page buttons when everything fits on one page, but still says how many there are', async () => {
    const wrapper = await mountSuspended(Table, { props: { ...base, page: 1, pageSize: 10, total: 3, noun: 'cores' } })
    expect(wrapper.find('[data-testid="things-pager"]').text()).toBe('1–3 of 3 cores')
    expect(wrapper.find('[data-testid="page-next"]').exists()).toBe(false)
  })

  it('shows a search box only when search is bound, emits what is typed, and keeps it over an empty result', async () => {
    const plain = await mountSuspended(Table, { props: base })
    expect(plain.find('[data-testid="things-search"]').exists()).toBe(false)
    const wrapper = await mountSuspended(Table, { props: { ...base, rows: [], search: 'zulu', searchLabel: 'Find a core', emptyText: 'No core matches “zulu”.' } })
    const input = wrapper.find('[data-testid="things-search"]')
    expect((input.element as HTMLInputElement).value).toBe('zulu')
    expect(wrapper.find(`label[for="${input.attributes('id')}"]`).text()).toBe('Find a core')
    expect(wrapper.find('[data-testid="things-empty"]').text()).toBe('No core matches “zulu”.')
    await input.setValue('alpha')
    expect(wrapper.emitted('update:search')).toEqual([['alpha']])
  })

  it('offers the sort keys in a menu for phones, in each column\'s first direction, and emits the one picked', async () => {
    const wrapper = await mountSuspended(Table, { props: { ...base, sort: { key: 'name', dir: 'asc' } } })
    const select = wrapper.find('[data-testid="things-phone-sort"]')
    expect(select.findAll('option').map(o => o.text())).toEqual(['Core, A to Z', 'Core, Z to A', 'Depth (mm), highest first', 'Depth (mm), lowest first'])
    expect((select.element as HTMLSelectElement).value).toBe('name:asc')
    await select.setValue('depth:desc')
    expect(wrapper.emitted('update:sort')).toEqual([[{ key: 'depth', dir: 'desc' }]])
    // A list in its own order (no sort key chosen) says so instead of showing a blank menu.
    const unsorted = await mountSuspended(Table, { props: base })
    const menu = unsorted.find('[data-testid="things-phone-sort"]')
    expect(menu.findAll('option')[0]!.text()).toBe('As listed')
    expect((menu.element as HTMLSelectElement).value).toBe('')
    const off = await mountSuspended(Table, { props: { ...base, phoneSort: false } })
    expect(off.find('[data-testid="things-phone-sort"]').exists()).toBe(false)
    const wide = await mountSuspended(Table, { props: { ...base, stackOnPhone: false } })
    expect(wide.find('[data-testid="things-phone-sort"]').exists()).toBe(false)
  })

  it('offers the page\'s own worded sort choices instead, a key no column shows included', async () => {
    const sortOptions = [{ label: 'Deepest first', sort: { key: 'depth', dir: 'desc' } }, { label: 'Recently changed', sort: { key: 'updated', dir: 'desc' } }]
    const wrapper = await mountSuspended(Table, { props: { ...base, sort: { key: 'updated', dir: 'desc' }, sortOptions } })
    const select = wrapper.find('[data-testid="things-phone-sort"]')
    expect(select.findAll('option').map(o => o.text())).toEqual(['Deepest first', 'Recently changed'])
    expect((select.element as HTMLSelectElement).value).toBe('updated:desc')
    await select.setValue('depth:desc')
    expect(wrapper.emitted('update:sort')).toEqual([[{ key: 'depth', dir: 'desc' }]])
  })

  it('gives each row its own test id and attributes when asked', async () => {
    const wrapper = await mountSuspended(Table, { props: { ...base, rowTestid: (row: Row) => `thing-${row.id}`, rowAttrs: (row: Row) => ({ 'data-status': row.depthMm == null ? 'no-depth' : 'ok' }) } })
    expect(wrapper.find('[data-testid="thing-2"]').attributes('data-status')).toBe('no-depth')
    expect(wrapper.find('[data-testid="thing-3"]').attributes('data-status')).toBe('ok')
  })

  it('fills a cell from its slot', async () => {
    const wrapper = await mountSuspended(Table, {
      props: base,
      slots: { 'cell-notes': ({ row }: { row: Row }) => h('em', { 'data-testid': 'note' }, `note ${row.id}`) },
    })
    expect(wrapper.findAll('[data-testid="note"]').map(n => n.text())).toEqual(['note 1', 'note 2', 'note 3'])
  })
})

describe('sortChoices', () => {
  it('words the directions by the kind of value', () => {
    const cols: DataColumn<Row, 'day' | 'price'>[] = [
      { key: 'day', label: 'Day', sortKey: 'day', sortKind: 'date', firstDir: 'desc' },
      { key: 'price', label: 'Price', sortKey: 'price', sortKind: 'number' },
      { key: 'notes', label: 'Notes' },
    ]
    expect(sortChoices(cols).map(c => c.label)).toEqual(['Day, newest first', 'Day, oldest first', 'Price, lowest first', 'Price, highest first'])
  })
})

describe('viewRows (lists that arrive whole)', () => {
  const many: Row[] = Array.from({ length: 23 }, (_, i) => ({ id: i + 1, name: `Core ${String.fromCharCode(65 + (i % 5))}${i + 1}`, depthMm: i % 4 === 0 ? null : 50 + i }))
  const options = { search: '', text: (row: Row) => row.name, sort: null, pick: (row: Row, key: Key) => (key === 'name' ? row.name : row.depthMm), page: 1, pageSize: 10 }

  it('pages the list and says how many there are', () => {
    const second = viewRows(many, { ...options, page: 2 })
    expect(second.total).toBe(23)
    expect(second.page).toBe(2)
    expect(second.rows.map(r => r.id)).toEqual([11, 12, 13, 14, 15, 16, 17, 18, 19, 20])
    expect(viewRows(many, { ...options, page: 3 }).rows.map(r => r.id)).toEqual([21, 22, 23])
  })

  it('keeps the page in range when the list shrinks under it', () => {
    expect(viewRows(many, { ...options, page: 9 }).page).toBe(3)
    expect(viewRows(many, { ...options, page: 0 }).page).toBe(1)
    expect(viewRows([], { ...options, page: 4 })).toEqual({ rows: [], total: 0, page: 1 })
  })

  it('searches every word typed, in any case, before sorting and paging', () => {
    const found = viewRows(many, { ...options, search: 'core  b', sort: { key: 'depth', dir: 'desc' } })
    // Names with "B": ids 2, 7, 12, 17, 22; of these only 17 has no depth (ids 1, 5, 9, 13, 17, 21), so it goes last.
    expect(found.total).toBe(5)
    expect(found.rows.map(r => r.id)).toEqual([22, 12, 7, 2, 17])
    expect(matchesSearch('Your quote Q-2026-0042', 'q-2026 QUOTE')).toBe(true)
    expect(matchesSearch('Your quote Q-2026-0042', 'invoice')).toBe(false)
    expect(matchesSearch('anything', '   ')).toBe(true)
  })
})

describe('sortRows', () => {
  it('sorts by the key in both directions, keeping empty values last', () => {
    const pick = (row: Row, key: Key) => (key === 'name' ? row.name : row.depthMm)
    expect(sortRows(rows, { key: 'depth', dir: 'asc' }, pick).map(r => r.id)).toEqual([1, 3, 2])
    expect(sortRows(rows, { key: 'depth', dir: 'desc' }, pick).map(r => r.id)).toEqual([3, 1, 2])
    expect(sortRows(rows, { key: 'name', dir: 'asc' }, pick).map(r => r.name)).toEqual(['Alpha', 'Bravo', 'Charlie'])
    expect(sortRows(rows, null, pick)).toEqual(rows)
  })
})
