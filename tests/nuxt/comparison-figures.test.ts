import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import Verdict from '~/components/comparison/Verdict.vue'
import Figures from '~/components/comparison/Figures.vue'
import Pulls from '~/components/comparison/Pulls.vue'
import { compareCores, type ComparisonLogInput, type ComparisonPullInput } from '../../server/analysis/beforeAfter'

// The hand-computed pair of tests/unit/analysis/beforeAfter.test.ts, on a 45 °C after day.
const pull = (index: number, ambientC: number, preC: number, chargeC: number): ComparisonPullInput => ({
  index, ambientTempC: ambientC, meanChargeTempC: chargeC, meanDeltaOverAmbientK: chargeC - ambientC, meanManifoldKpa: 200, pressureRatio: 2,
  preCoolerTempC: preC, effectiveness: (preC - chargeC) / (preC - ambientC), effectivenessSource: 'measured', meanRpm: 3000,
})
const before: ComparisonLogInput = { logId: 1, label: 'of 14 Jul', pulls: [pull(0, 20, 120, 58), pull(1, 20, 120, 56)] }
const after: ComparisonLogInput = { logId: 2, label: 'of 2 Aug', pulls: [pull(0, 45, 145, 61), pull(1, 45, 145, 63)] }
const result = compareCores([before], [after], { ratedPowerKw: 100 })
const view = { ...result, title: '', logs: [{ side: 'before' as const, label: 'of 14 Jul', recordedOn: null, coreName: 'Small core' }, { side: 'after' as const, label: 'of 2 Aug', recordedOn: null, coreName: 'Big core' }] }

describe('ComparisonVerdict', () => {
  it('says the after core is better, warns that the raw temperatures mislead, and gives the dyno note', async () => {
    const wrapper = await mountSuspended(Verdict, { props: { comparison: view } })
    expect(wrapper.find('[data-testid="comparison-verdict"]').attributes('data-tone')).toBe('better')
    expect(wrapper.text()).toMatch(/Common practice, no source/)
    expect(wrapper.find('[data-testid="comparison-warning-raw-misleads"]').text()).toMatch(/25\.0 K warmer/)
  })
})

describe('ComparisonVerdict headline and sentence, as read', () => {
  const read = async (comparison: typeof view) => {
    const wrapper = await mountSuspended(Verdict, { props: { comparison } })
    return { headline: wrapper.find('h2').text(), sentence: wrapper.find('[data-testid="comparison-verdict-text"]').text(), tone: wrapper.find('[data-testid="comparison-verdict"]').attributes('data-tone') }
  }

  it('better: the headline, then the gain with its interval and what it is worth at the reference ambient', async () => {
    expect(await read(view)).toEqual({
      tone: 'better',
      headline: 'The after core works better',
      // ε̄ 0.63 → 0.83 (+20.0 points), ΔT over ambient 38 → 18 K (−20.0 K); at 25 °C the charge air is
      // 18.7 K cooler (the unit test's working), 1 − T_after/T_before ≈ 5.9 % denser.
      sentence: 'The after core works better: effectiveness +20.0 points (95 % interval +13.9 points to +26.1 points), and the charge air sits 20.0 K less above the ambient temperature. At 25 °C ambient the engine would breathe charge air 18.7 K cooler: about 5.9 % more power at the same boost (upper bound).',
    })
  })

  it('within the noise: two pulls a side whose spread covers the change', async () => {
    // Before ε 0.70 and 0.60, after 0.69 and 0.61 at one ambient: the means are equal (0.65) and the
    // spread of ±5 points a side gives an interval that includes no change.
    const noisy = compareCores([{ ...before, pulls: [pull(0, 20, 120, 50), pull(1, 20, 120, 60)] }], [{ ...after, pulls: [pull(0, 20, 120, 51), pull(1, 20, 120, 59)] }], { ratedPowerKw: 100 })
    const { headline, sentence, tone } = await read({ ...view, ...noisy })
    expect({ headline, tone }).toEqual({ headline: 'Within the noise', tone: 'noise' })
    expect(sentence).toMatch(/^The difference is within the noise: effectiveness changed by \+0\.0 points, but its 95 % interval, −\d+\.\d points to \+\d+\.\d points, includes no change at all\. More pulls on each side would narrow it\.$/)
  })

  it('too few pulls: says so instead of giving an interval, and asks for more pulls', async () => {
    const one = compareCores([{ ...before, pulls: [pull(0, 20, 120, 50)] }], [{ ...after, pulls: [pull(0, 20, 120, 45)] }], { ratedPowerKw: 100 })
    expect(await read({ ...view, ...one })).toEqual({
      tone: 'too-few',
      headline: 'Too few pulls to tell',
      // ε 0.70 → 0.75: +5.0 points, one pull a side.
      sentence: 'Too few matched pulls for an interval: effectiveness changed by +5.0 points, but at least two pulls a side are needed to say whether that is more than pull-to-pull spread. Log a few more pulls.',
    })
  })
})

describe('ComparisonFigures', () => {
  it('gives the gain in points with its Welch interval, and follows the units store', async () => {
    const wrapper = await mountSuspended(Figures, { props: { comparison: view } })
    // ε̄ 0.63 → 0.83: +20.0 points, interval 0.139151 … 0.260849 (see the unit test's working)
    expect(wrapper.find('[data-testid="figure-effectiveness"]').text()).toMatch(/\+20\.0 points.*\+13\.9 points to \+26\.1 points/)
    const units = useUnitsStore()
    units.temperature = 'F'
    try {
      const fahrenheit = await mountSuspended(Figures, { props: { comparison: view } })
      // ΔT change −20 K = −36 °F of difference
      expect(fahrenheit.find('[data-testid="figure-delta"]').text()).toMatch(/−36\.0 °F/)
    }
    finally {
      units.temperature = 'C'
    }
  })
})

describe('ComparisonPulls', () => {
  const labels: Record<number, string> = { 1: 'of 14 Jul', 2: 'of 2 Aug' }
  const withLogs = { ...view, pulls: view.pulls.map(({ logId, ...p }) => ({ ...p, log: labels[logId] })) }

  it('lists every pull with its log, and finds the pulls of one side by search', async () => {
    const wrapper = await mountSuspended(Pulls, { props: { comparison: withLogs } })
    const rows = () => wrapper.findAll('[data-testid="comparison-pull"]')
    expect(rows()).toHaveLength(4)
    expect(rows()[0]!.findAll('td').map(td => td.text()).slice(0, 3)).toEqual(['before', 'of 14 Jul', '1'])
    await wrapper.find('[data-testid="comparison-pulls-search"]').setValue('aug')
    expect(rows().map(r => r.findAll('td')[0]!.text())).toEqual(['after', 'after'])
  })

  it('sorts by charge temperature over ambient, hottest first on the first click', async () => {
    const wrapper = await mountSuspended(Pulls, { props: { comparison: withLogs } })
    await wrapper.find('[data-testid="sort-delta"]').trigger('click')
    // Over ambient: before 38, 36 K; after 16, 18 K.
    expect(wrapper.findAll('[data-testid="comparison-pull"]').map(r => r.findAll('td')[6]!.text())).toEqual(['38.0 K', '36.0 K', '18.0 K', '16.0 K'])
  })
})
