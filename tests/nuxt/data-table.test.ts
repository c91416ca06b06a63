import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import { h, type Component } from 'vue'
import UiDataTable from '~/components/ui/UiDataTable.vue'
import { sortRows, type DataColumn } from '~/utils/dataTable'

interface Row { id: number, name: string, depthMm: number | null }
type Key = 'name' | 'depth'
const rows: Row[] = [
  { id: 1, name: 'Bravo', depthMm: 76 },
  { id: 2, name: 'Alpha', depthMm: null },
  { id: 3, name: 'Charlie', depthMm: 100 },
]
const columns: DataColumn<Row, Key>[] = [
  { key: 'name', label: 'Core', sortKey: 'name' },
  { key: 'depth', label: 'Depth (mm)', sortKey: 'depth', firstDir: 'desc', align: 'right', value: row => (row.depthMm == null ? '—' : String(row.depthMm)) },
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

  it('fills a cell from its slot', async () => {
    const wrapper = await mountSuspended(Table, {
      props: base,
      slots: { 'cell-notes': ({ row }: { row: Row }) => h('em', { 'data-testid': 'note' }, `note ${row.id}`) },
    })
    expect(wrapper.findAll('[data-testid="note"]').map(n => n.text())).toEqual(['note 1', 'note 2', 'note 3'])
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
