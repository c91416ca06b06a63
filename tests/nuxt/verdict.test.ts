import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import Verdict from '~/components/report/Verdict.vue'
import { analysisWith } from '../fixtures/report'

const vehicle = { ratedPowerKw: 110, fuel: 'diesel' }

describe('ReportVerdict', () => {
  it('leads with the headline and the figures a driver can follow', async () => {
    const wrapper = await mountSuspended(Verdict, { props: { analysis: analysisWith(1.8), vehicle } })
    expect(wrapper.find('[data-testid="verdict"]').attributes('data-level')).toBe('fair')
    expect(wrapper.find('[data-testid="verdict-headline"]').text()).toMatch(/Some heat soak/)
    expect(wrapper.find('[data-testid="verdict-summary"]').text()).toMatch(/climbed 9\.0 K/)
    expect(wrapper.find('[data-testid="verdict-assumptions"]').text()).toMatch(/air-limited engine at the same boost/)
    expect(wrapper.findAll('[data-testid="verdict-facts"] dt').map(d => d.text())).toContain('Soak per pull')
  })

  it('follows the units store', async () => {
    const units = useUnitsStore()
    units.temperature = 'F'
    try {
      const wrapper = await mountSuspended(Verdict, { props: { analysis: analysisWith(1.8), vehicle } })
      expect(wrapper.find('[data-testid="verdict-summary"]').text()).toMatch(/16\.2 °F/)
    }
    finally {
      units.temperature = 'C'
    }
  })

  it('shows a good verdict in the good tone', async () => {
    const wrapper = await mountSuspended(Verdict, { props: { analysis: analysisWith(0.4), vehicle } })
    const box = wrapper.find('[data-testid="verdict"]')
    expect(box.attributes('data-level')).toBe('good')
    expect(box.classes()).toContain('bg-good-soft')
  })

  it('tells the driver how to record pulls when there are none', async () => {
    const wrapper = await mountSuspended(Verdict, { props: { analysis: analysisWith(1, 0), vehicle: null } })
    expect(wrapper.find('[data-testid="verdict-headline"]').text()).toMatch(/No pulls found/)
    expect(wrapper.find('[data-testid="verdict-consider"]').text()).toMatch(/closed course/)
  })

  it('reads the exact words a driver sees for a fair soak on a 110 kW diesel', async () => {
    const wrapper = await mountSuspended(Verdict, { props: { analysis: analysisWith(1.8), vehicle } })
    expect(wrapper.find('[data-testid="verdict-headline"]').text()).toBe('Some heat soak: the car loses a little power pull after pull')
    // 40 → 49 °C over six pulls; 1 − 313.15/322.15 = 2.794 % of 110 kW = 3.07 kW.
    expect(wrapper.find('[data-testid="verdict-summary"]').text()).toBe('Over six pulls the charge air climbed 9.0 K from the first to the last pull, and the hottest pull made about 2.8 % (about 3.1 kW) less power than the coolest.')
    expect(wrapper.findAll('[data-testid="verdict-consider"] li').map(li => li.text())).toEqual([
      'Give the car more time between hard pulls; the charge air recovers as the core cools.',
    ])
    const facts = Object.fromEntries(wrapper.findAll('[data-testid="verdict-facts"] > div').map(div => [div.find('dt').text(), div.find('dd').text()]))
    expect(facts).toMatchObject({
      'Pulls analysed': '6',
      'Charge-air rise, first to last pull': '9.0 K',
      'Soak per pull': '1.80 K per pull (fit R² 0.98)',
      'Mean temperature over ambient': '14.5 K',
      'Most power lost vs coolest pull': '2.8 %',
      'Core recovery time': '80 s',
    })
  })

  it('marks an estimated effectiveness and warns when the core removes little heat', async () => {
    const analysis = analysisWith(1.8)
    Object.assign(analysis.summary, { meanEffectiveness: 0.55, effectivenessSource: 'estimated', measuredPullCount: 0, meanEffectivenessMeasured: null, estimatedPullCount: 6, meanEffectivenessEstimated: 0.55 })
    const wrapper = await mountSuspended(Verdict, { props: { analysis, vehicle } })
    const facts = Object.fromEntries(wrapper.findAll('[data-testid="verdict-facts"] > div').map(div => [div.find('dt').text(), div.find('dd').text()]))
    expect(facts['Effectiveness, estimated (6 pulls; reads low)']).toBe('55 %')
    expect(wrapper.find('[data-testid="verdict-consider"]').text()).toContain('The intercooler removes only about 55 % of the heat it could: check for a blocked or damaged core and for air going around it.')
  })

  it('says the ambient temperature was typed in when it was not logged', async () => {
    const analysis = analysisWith(1.8)
    analysis.summary.ambientSource = 'entered'
    const wrapper = await mountSuspended(Verdict, { props: { analysis, vehicle } })
    expect(wrapper.find('[data-testid="verdict-assumptions"]').text()).toMatch(/The ambient temperature was entered by hand, not logged\.$/)
    const logged = await mountSuspended(Verdict, { props: { analysis: analysisWith(1.8), vehicle } })
    expect(logged.find('[data-testid="verdict-assumptions"]').text()).not.toContain('entered by hand')
  })

  it('does not judge soak from a single pull', async () => {
    const wrapper = await mountSuspended(Verdict, { props: { analysis: analysisWith(1, 1), vehicle } })
    expect(wrapper.find('[data-testid="verdict"]').attributes('data-level')).toBe('unknown')
    expect(wrapper.find('[data-testid="verdict-headline"]').text()).toBe('One pull: not enough to judge heat soak from pull to pull')
    expect(wrapper.find('[data-testid="verdict-summary"]').text()).toBe('In the one pull found, the charge air sat 10.0 K above the ambient temperature.')
  })

  it('calls heavy soak poor, in the danger tone, and names a bigger core and knock on a petrol car', async () => {
    const wrapper = await mountSuspended(Verdict, { props: { analysis: analysisWith(4), vehicle: { ratedPowerKw: 132, fuel: 'petrol' } } })
    const box = wrapper.find('[data-testid="verdict"]')
    expect(box.attributes('data-level')).toBe('poor')
    expect(box.classes()).toContain('bg-danger-soft')
    expect(wrapper.find('[data-testid="verdict-headline"]').text()).toBe('Heavy heat soak: the car loses noticeable power as it heats up')
    const consider = wrapper.find('[data-testid="verdict-consider"]').text()
    expect(consider).toContain('larger intercooler core')
    expect(consider).toContain('risk of knock')
  })

  it('reads one story for a core that does not soak but runs warm over ambient, and for a clear soak', async () => {
    const warm = analysisWith(0.2, 4)
    warm.pulls.forEach((p, i) => {
      p.meanDeltaOverAmbientK = [26, 27, 27.5, 28][i]!
    })
    warm.summary.meanDeltaOverAmbientK = 27.125
    const steady = await mountSuspended(Verdict, { props: { analysis: warm, vehicle: { ratedPowerKw: 100, fuel: 'petrol' } } })
    expect(steady.find('[data-testid="verdict-headline"]').text()).toBe('The intercooler holds up well')
    expect(steady.findAll('[data-testid="verdict-consider"] li').map(li => li.text())).toEqual([
      'No heat soak to speak of across the pulls, but the charge air runs 27.1 K above the ambient temperature on every pull: a larger core, or better air flow to it (ducting, no blocked grille), would lower that. More than 25 K over ambient is a lot for a working intercooler (common practice, no source); ask the workshop whether a change would pay off.',
    ])

    // 40 → 60 °C over six pulls (1 − 313.15/333.15 = 6.0 % lost): heavy soak, so more time between pulls and a larger core.
    const soaking = await mountSuspended(Verdict, { props: { analysis: analysisWith(4), vehicle } })
    expect(soaking.find('[data-testid="verdict"]').attributes('data-level')).toBe('poor')
    expect(soaking.findAll('[data-testid="verdict-consider"] li').map(li => li.text())).toEqual([
      'Give the car more time between hard pulls; the charge air recovers as the core cools.',
      'Ask the workshop whether a larger intercooler core, or better air flow to it (ducting, no blocked grille), would pay off.',
    ])
  })

  it('offers a tuner to keep the pulls left out when most were, and tells the drive in plain words', async () => {
    const analysis = analysisWith(1, 1)
    analysis.summary.foundPullCount = 5
    analysis.summary.leftOutPulls = [1, 2, 3, 4].map(k => ({ startS: k * 60, endS: k * 60 + 8, reasons: ['temp-spike' as const] }))
    const reader = await mountSuspended(Verdict, { props: { analysis, vehicle } })
    expect(reader.find('[data-testid="verdict-headline"]').text()).toMatch(/^Most pulls were left out: 4 of the 5 pulls/)
    expect(reader.find('[data-testid="keep-left-out"]').exists()).toBe(false)
    const tuner = await mountSuspended(Verdict, { props: { analysis, vehicle, canEdit: true } })
    await tuner.find('[data-testid="keep-left-out"]').trigger('click')
    expect(tuner.emitted('keepLeftOut')).toEqual([[true]])
    expect(tuner.find('[data-testid="verdict-drive"]').text()).toMatch(/heated up while the car was slow or stopped/)
  })
})
