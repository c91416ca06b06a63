import { mountSuspended } from '@nuxt/test-utils/runtime'
import { afterEach, describe, expect, it } from 'vitest'
import PullTable from '~/components/report/PullTable.vue'
import UnitSwitcher from '~/components/report/UnitSwitcher.vue'
import { analysisWith } from '../fixtures/report'

describe('ReportUnitSwitcher', () => {
  afterEach(() => {
    const units = useUnitsStore()
    units.temperature = 'C'
    units.pressure = 'kPa'
    units.power = 'kW'
  })

  it('offers the catalogue\'s display units, written as on the report', async () => {
    const wrapper = await mountSuspended(UnitSwitcher)
    const options = (quantity: string) => wrapper.find(`[data-testid="unit-${quantity}"]`).findAll('option').map(o => [o.attributes('value'), o.text()])
    expect(options('temperature')).toEqual([['C', '°C'], ['F', '°F']])
    expect(options('pressure')).toEqual([['kPa', 'kPa'], ['bar', 'bar'], ['psi', 'psi']])
    expect(options('power')).toEqual([['kW', 'kW'], ['hp', 'hp'], ['PS', 'PS']])
    expect(wrapper.findAll('select').map(s => s.attributes('aria-label'))).toEqual(['Temperature unit', 'Pressure unit', 'Power unit'])
  })

  it('changes how the pull table reads, without saving when it may not', async () => {
    const switcher = await mountSuspended(UnitSwitcher)
    const table = await mountSuspended(PullTable, { props: { pulls: analysisWith(1.8).pulls } })
    await switcher.find('[data-testid="unit-temperature"]').setValue('F')
    await switcher.find('[data-testid="unit-pressure"]').setValue('psi')
    const first = table.findAll('[data-testid="pull-row"]')[0]!.findAll('td').map(td => td.text())
    // Pull 1: 40 °C = 104.0 °F; 10 K over ambient = 18.0 °F; 220 kPa ÷ 6.894757 kPa/psi = 31.9 psi.
    expect(first.slice(2, 5)).toEqual(['104.0 °F', '18.0 °F', '31.9 psi'])
    expect(switcher.text()).not.toContain('saved')
  })
})
