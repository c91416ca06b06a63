import { mountSuspended } from '@nuxt/test-utils/runtime'
import { afterEach, describe, expect, it } from 'vitest'
import SummaryCards from '~/components/report/SummaryCards.vue'
import type { AnalysisSummary } from '#shared/types/report'
import { analysisWith } from '../fixtures/report'

// What each card reads for a given analysis: the figure and the small print under it.
async function cards(overrides: Partial<AnalysisSummary> = {}, pullStepK = 1.8) {
  const summary = { ...analysisWith(pullStepK).summary, meanEffectiveness: 0.62, ...overrides }
  const wrapper = await mountSuspended(SummaryCards, { props: { summary } })
  const read = (key: string) => wrapper.find(`[data-testid="summary-${key}"]`).findAll('p').map(p => p.text())
  return { wrapper, read }
}

describe('ReportSummaryCards', () => {
  afterEach(() => {
    const units = useUnitsStore()
    units.temperature = 'C'
    units.pressure = 'kPa'
    units.power = 'kW'
  })

  it('reads six pulls climbing 1.8 K each from 40 °C at a logged 30 °C ambient', async () => {
    const { read } = await cards()
    expect(read('pulls')).toEqual(['Pulls', '6', 'full-load rule chosen automatically; see below'])
    // Hottest pull: mean 40 + 5 · 1.8 = 49 °C, peak 2 K above its mean.
    expect(read('peak')).toEqual(['Highest charge temperature', '51.0 °C', 'ambient 30.0 °C'])
    expect(read('soak')).toEqual(['Soak per pull', '1.80 K', '9.0 K first to last'])
    // 1 − 313.15/322.15 = 2.794 % (density law), shown to one decimal.
    expect(read('loss')).toEqual(['Most power lost', '2.8 %', 'vs the coolest pull, at equal ambient and boost'])
    expect(read('eff')).toEqual(['Measured effectiveness', '62 %', 'mean over the pulls'])
    expect(read('baro')).toEqual(['Barometric pressure', '100.5 kPa', 'logged'])
  })

  it('says when effectiveness is estimated, ambient entered and pressure from standard air', async () => {
    const { read } = await cards({ effectivenessSource: 'estimated', ambientSource: 'entered', baroSource: 'isa', baroKpa: 95.46 })
    expect(read('eff')[2]).toBe('no pre-cooler sensor: estimated from boost, reads a little low')
    expect(read('peak')[2]).toBe('ambient 30.0 °C (entered)')
    expect(read('baro')).toEqual(['Barometric pressure', '95.5 kPa', 'standard air for the altitude'])
  })

  it('gives the power lost in kW when the car\'s rated power is known', async () => {
    const { read } = await cards({ maxPowerLossVsCoolestKw: 3.07 })
    expect(read('loss')[2]).toBe('≈ 3.1 kW vs the coolest pull, at equal ambient and boost')
  })

  it('shows dashes, not zeros, where a log without pulls has no figure', async () => {
    const { read } = await cards({ meanEffectiveness: null }, 1)
    const none = await cards({
      pullCount: 0, peakChargeTempC: null, soakIndexKPerPull: null, chargeTempRiseK: null,
      maxPowerLossVsCoolestPct: null, meanEffectiveness: null, ambientTempC: null,
    })
    expect(read('eff')[1]).toBe('—')
    expect(none.read('pulls')[1]).toBe('0')
    expect(none.read('peak')).toEqual(['Highest charge temperature', '—', 'ambient —'])
    expect(none.read('soak')).toEqual(['Soak per pull', '—', ''])
    expect(none.read('loss')[1]).toBe('—')
  })

  it('follows the display units: °F for temperatures and differences, psi, hp', async () => {
    const units = useUnitsStore()
    units.temperature = 'F'
    units.pressure = 'psi'
    units.power = 'hp'
    const { read } = await cards({ maxPowerLossVsCoolestKw: 3.07 })
    // 51 °C = 123.8 °F; 30 °C = 86.0 °F; 1.8 K = 3.24 °F; 100.5 kPa / 6.894757 = 14.6 psi; 3.07 kW = 4.1 hp.
    expect(read('peak')).toEqual(['Highest charge temperature', '123.8 °F', 'ambient 86.0 °F'])
    expect(read('soak')[1]).toBe('3.24 °F')
    expect(read('baro')[1]).toBe('14.6 psi')
    expect(read('loss')[2]).toBe('≈ 4.1 hp vs the coolest pull, at equal ambient and boost')
  })
})
