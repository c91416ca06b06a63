import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import RankedCores from '~/components/sizing/RankedCores.vue'
import type { CoreEvidence } from '#shared/types/comparison'
import type { SizingCandidate } from '#shared/types/cores'

// Two ranked cores as the sizing route returns them: one the workshop has measured, one it has not.
function candidate(rank: number, coreId: number, name: string, extra: Partial<SizingCandidate> = {}): SizingCandidate {
  return {
    coreId, name, rank, uaWPerK: 600, predictedEffectiveness: 0.89, chargeTempC: 44.8, densityGainPct: 5.9,
    powerRecoveredPct: 9.4, powerRecoveredKw: 10.3, pressureDropKpa: 3.1, pressureDropChangeKpa: -6.8,
    reason: `${rank === 1 ? 'Best' : '2nd of 2'}: holds the charge 10 K over ambient for about 9.4 % more power than the fitted core with 6.8 kPa less pressure drop.`,
    ...extra,
  }
}
const sizing = {
  id: 7,
  vehicleId: 3,
  candidates: [
    candidate(1, 11, 'Tube-and-fin front-mount 650'),
    candidate(2, 12, 'Bar-and-plate front-mount 600', { predictedEffectiveness: 0.884, chargeTempC: 45.3, powerRecoveredPct: 9.2, powerRecoveredKw: null, pressureDropChangeKpa: 0.2, reason: '2nd of 2: holds the charge 10 K over ambient for about 9.2 % more power than the fitted core with about the same pressure drop.' }),
  ],
  assumptions: ['Crossflow core, both streams unmixed, steady state.'],
}
const spread = (median: number | null, p10: number | null, p90: number | null) => ({ median, p10, p90 }) as CoreEvidence['effectiveness']
const measured: CoreEvidence = {
  coreId: 12,
  core: { id: 12, name: 'Bar-and-plate front-mount 600', kind: 'front-mount', faceWidthMm: 600, faceHeightMm: 300, depthMm: 76, retired: false },
  logCount: 1, pullCount: 6, measuredPullCount: 6, estimatedPullCount: 0,
  effectiveness: spread(0.854, 0.846, 0.877),
  deltaOverAmbientK: spread(12.2, 10.1, 13.8),
  vehicles: [{ id: 3, description: 'Demo hatchback', registration: 'X', logCount: 1, pullCount: 6, medianEffectiveness: 0.854 }],
}

describe('SizingRankedCores', () => {
  it('gives the fabricator each core\'s rank, reason, and prediction beside what was measured', async () => {
    const wrapper = await mountSuspended(RankedCores, { props: { sizing, evidence: { 11: null, 12: measured } } })
    const rows = wrapper.findAll('[data-testid="sizing-row"]')
    expect(rows).toHaveLength(2)
    const cells = rows.map(row => row.findAll('td').map(td => td.text()))
    expect(cells[0]![0]).toBe('1')
    expect(cells[0]![1]).toBe('Tube-and-fin front-mount 650')
    expect(cells[0]!.slice(3, 8)).toEqual(['44.8 °C', '+5.9 %', '+9.4 % (+10.3 kW)', '−6.8 kPa', sizing.candidates[0]!.reason])
    expect(cells[1]![0]).toBe('2')
    // No target power, so no kW; a pressure drop change of 0.2 kPa still shows its sign.
    expect(cells[1]!.slice(3, 8)).toEqual(['45.3 °C', '+5.9 %', '+9.2 %', '+0.2 kPa', sizing.candidates[1]!.reason])

    expect(wrapper.find('[data-testid="predicted-11"]').text()).toBe('89 % predicted')
    expect(wrapper.find('[data-testid="measured-11"]').text()).toBe('not measured here yet')
    expect(wrapper.find('[data-testid="predicted-12"]').text()).toBe('88 % predicted')
    // Median 85 %, 8 pulls in 10 between 85 and 88 %: the measurement a few points under the prediction.
    expect(wrapper.find('[data-testid="measured-12"]').text()).toBe('measured here: 85 % (85–88 %) over 6 pulls, 1 log, 1 car · evidence')
    expect(wrapper.find('[data-testid="measured-12"] a').attributes('href')).toBe('/cores/12/evidence')
    expect(wrapper.text()).toContain('When the two differ by more than a few points, trust the measurement and look into why.')
    // A tuner or driver sizing nothing to quote sees no quote links.
    expect(wrapper.find('[data-testid="quote-core-11"]').exists()).toBe(false)
  })

  it('puts the fitting cautions before the ranking', async () => {
    const wrapper = await mountSuspended(RankedCores, { props: { sizing, evidence: {} } })
    const cautions = wrapper.find('[data-testid="sizing-cautions"]')
    expect(cautions.exists()).toBe(true)
    expect(cautions.findAll('li').map(li => li.text())).toEqual([
      'These figures are an estimate from a model. Confirm them with a new log after fitting, at a similar ambient temperature.',
      'Check clearance, and that the radiator and the air-conditioning condenser behind the core still get enough air; check the crash structure is not weakened.',
      'Cutting a bumper, its beam or brackets follows the car maker\'s repair instructions and your local road-legality rules; ask a licensed inspector when unsure.',
      'Pressure-test the charge system (pipes, couplers, clamps and core) before the car goes on the road.',
    ])
    const html = wrapper.html()
    expect(html.indexOf('data-testid="sizing-cautions"')).toBeLessThan(html.indexOf('data-testid="sizing-table"'))
    // With no evidence loaded every core reads as not measured; the ranking stands.
    expect(wrapper.find('[data-testid="measured-12"]').text()).toBe('not measured here yet')
  })

  it('links each core to a quote for whoever may write one', async () => {
    const wrapper = await mountSuspended(RankedCores, { props: { sizing, evidence: {}, mayQuote: true } })
    expect(wrapper.find('[data-testid="quote-core-12"]').attributes('href')).toBe('/quotes/new?vehicleId=3&sizingId=7&coreId=12')
    expect(wrapper.find('[data-testid="quote-core-12"]').text()).toBe('Quote this core')
  })
})
