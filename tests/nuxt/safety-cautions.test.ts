import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import { QUOTE_CAUTIONS } from '#shared/utils/quotes'
import FabricationCautions from '~/components/safety/FabricationCautions.vue'
import LoggingCautions from '~/components/safety/LoggingCautions.vue'
import SafetyCautions from '~/components/safety/SafetyCautions.vue'
import SizingCautions from '~/components/safety/SizingCautions.vue'

describe('SafetyCautions', () => {
  it('shows the heading and every point as a list in a warning box', async () => {
    const wrapper = await mountSuspended(SafetyCautions, { props: { title: 'Before you test', items: ['Wear eye protection.', 'Release the pressure first.'] }, attrs: { 'data-testid': 'c' } })
    expect(wrapper.attributes('data-testid')).toBe('c')
    expect(wrapper.attributes('role')).toBe('status')
    expect(wrapper.find('p').text()).toBe('Before you test')
    expect(wrapper.findAll('li').map(li => li.text())).toEqual(['Wear eye protection.', 'Release the pressure first.'])
  })

  it('keeps each page\'s cautions under their own heading and test id', async () => {
    const logging = await mountSuspended(LoggingCautions)
    expect(logging.attributes('data-testid')).toBe('logging-cautions')
    expect(logging.find('p').text()).toBe('Before you record a log at full load')
    expect(logging.text()).toMatch(/never on public roads/)
    const sizing = await mountSuspended(SizingCautions)
    expect(sizing.attributes('data-testid')).toBe('sizing-cautions')
    expect(sizing.text()).toMatch(/Pressure-test the charge system/)
    const fabrication = await mountSuspended(FabricationCautions)
    expect(fabrication.attributes('data-testid')).toBe('fabrication-cautions')
    expect(fabrication.findAll('li')).toHaveLength(QUOTE_CAUTIONS.length)
  })
})
