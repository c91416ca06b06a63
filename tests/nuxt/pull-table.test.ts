import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import PullTable from '~/components/report/PullTable.vue'
import { analysisWith, pull } from '../fixtures/report'

const cellsOf = (row: { findAll: (s: string) => Array<{ text: () => string }> }) => row.findAll('td').map(td => td.text())

describe('ReportPullTable', () => {
  it('lists each pull with its figures, in the order they were driven', async () => {
    const wrapper = await mountSuspended(PullTable, { props: { pulls: analysisWith(1.8).pulls } })
    const rows = wrapper.findAll('[data-testid="pull-row"]')
    expect(rows).toHaveLength(6)
    expect(wrapper.findAll('th').map(th => th.text().replace(/[▲▼↕]/g, '').trim()))
      .toEqual(['Pull', 'From (s)', 'Charge temperature', 'Over ambient', 'Boost', 'Effectiveness', 'Density ratio (× standard air)', 'Power lost'])
    // Pull 1: 60–67 s, 40 °C, 10 K over 30 °C ambient, 220 kPa, ε (130 − 40)/100, σ 2.10, no loss.
    expect(cellsOf(rows[0]!)).toEqual(['1', '60.0–67.0', '40.0 °C', '10.0 K', '220.0 kPa', '90 %', '2.10', '0.0 %'])
    // Pull 6: 49 °C; loss 1 − 313.15/322.15 = 2.794 %.
    expect(cellsOf(rows[5]!)).toEqual(['6', '285.0–292.0', '49.0 °C', '19.0 K', '220.0 kPa', '81 %', '2.00', '2.8 %'])
    expect(wrapper.text()).toContain('Power lost is against the coolest pull of this log, with every pull restated at the same ambient and boost, so the weather does not count as heat soak.')
    expect(wrapper.text()).not.toContain('Effectiveness estimated')
  })

  it('sorts by power lost, largest first, and back', async () => {
    const wrapper = await mountSuspended(PullTable, { props: { pulls: analysisWith(1.8).pulls } })
    await wrapper.find('[data-testid="sort-powerLossVsCoolestPct"]').trigger('click')
    expect(wrapper.findAll('[data-testid="pull-row"]').map(r => cellsOf(r)[0])).toEqual(['6', '5', '4', '3', '2', '1'])
    await wrapper.find('[data-testid="sort-powerLossVsCoolestPct"]').trigger('click')
    expect(wrapper.findAll('[data-testid="pull-row"]').map(r => cellsOf(r)[0])).toEqual(['1', '2', '3', '4', '5', '6'])
  })

  it('marks estimated effectiveness, shows dashes for missing figures and names pulls set by hand', async () => {
    const pulls = [
      pull(0, 45, { effectivenessSource: 'estimated', effectiveness: 0.714 }),
      pull(1, 47, { effectiveness: null, effectivenessSource: null, densityRatioIsa: null, origin: 'added', autoIndex: null }),
    ]
    const wrapper = await mountSuspended(PullTable, { props: { pulls } })
    const [first, second] = wrapper.findAll('[data-testid="pull-row"]')
    expect(cellsOf(first!)[5]).toBe('71 %*')
    expect(cellsOf(second!)[0]).toBe('2 added by hand')
    expect(cellsOf(second!)[5]).toBe('—')
    expect(cellsOf(second!)[6]).toBe('—')
    expect(wrapper.text()).toContain('* Effectiveness estimated: no pre-cooler temperature sensor, so the pre-cooler temperature was worked out from boost.')
  })

  it('says so when there are no pulls, instead of an empty table', async () => {
    const wrapper = await mountSuspended(PullTable, { props: { pulls: [] } })
    expect(wrapper.find('[data-testid="pull-table"]').exists()).toBe(false)
    expect(wrapper.text()).toContain('No pulls to list.')
  })

  it('offers "Not a run" only to someone who may edit, and hands the pull over', async () => {
    const pulls = analysisWith(1).pulls
    expect((await mountSuspended(PullTable, { props: { pulls } })).find('[data-testid="remove-pull-2"]').exists()).toBe(false)
    const wrapper = await mountSuspended(PullTable, { props: { pulls, canEdit: true } })
    await wrapper.find('[data-testid="remove-pull-2"]').trigger('click')
    expect(wrapper.emitted('remove')).toEqual([[pulls[2]]])
    const busy = await mountSuspended(PullTable, { props: { pulls, canEdit: true, busy: true } })
    expect(busy.find('[data-testid="remove-pull-2"]').attributes('disabled')).toBeDefined()
  })
})
