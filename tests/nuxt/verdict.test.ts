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
