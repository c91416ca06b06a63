import { mountSuspended } from '@nuxt/test-utils/runtime'
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { h } from 'vue'
import PageActions from '~/components/report/PageActions.vue'
import PageHeader from '~/components/report/PageHeader.vue'

describe('ReportPageHeader', () => {
  it('names the car with a link to it, when, the title and what the page adds, beside the unit switcher', async () => {
    const wrapper = await mountSuspended(PageHeader, {
      props: { vehicleId: 7, vehicleDescription: '2.0 L four-cylinder turbo-diesel hatchback', when: 'worked out 3 Mar 2026', title: 'Before and after', titleTestid: 'comparison-title' },
      slots: { default: () => h('p', { 'data-testid': 'extra' }, 'Both cores compared at 25 °C ambient temperature') },
    })
    const link = wrapper.find('a')
    expect(link.attributes('href')).toBe('/vehicles/7')
    expect(link.text()).toBe('2.0 L four-cylinder turbo-diesel hatchback')
    expect(wrapper.find('p').text()).toMatch(/· worked out 3 Mar 2026$/)
    expect(wrapper.find('h1[data-testid="comparison-title"]').text()).toBe('Before and after')
    expect(wrapper.find('[data-testid="extra"]').text()).toBe('Both cores compared at 25 °C ambient temperature')
    expect(wrapper.find('[data-testid="unit-switcher"]').exists()).toBe(true)
  })
})

describe('ReportPageActions', () => {
  // happy-dom has no print dialog: stand one in for the test and take it away after.
  const print = vi.fn()
  beforeEach(() => {
    Object.defineProperty(window, 'print', { value: print, configurable: true, writable: true })
  })
  afterEach(() => {
    Reflect.deleteProperty(window, 'print')
    print.mockClear()
  })

  it('prints the page, and offers no delete to someone who may not delete', async () => {
    const wrapper = await mountSuspended(PageActions, { slots: { default: () => h('a', { href: '/x.csv' }, 'Pulls as CSV') } })
    const buttons = wrapper.findAll('button')
    expect(buttons.map(b => b.text())).toEqual(['Print'])
    expect(wrapper.find('a').text()).toBe('Pulls as CSV')
    expect(wrapper.attributes('data-print')).toBe('hide')
    await buttons[0]!.trigger('click')
    expect(print).toHaveBeenCalledOnce()
    expect(wrapper.emitted('delete')).toBeUndefined()
  })

  it('asks the page to delete when its delete button is pressed', async () => {
    const wrapper = await mountSuspended(PageActions, { props: { deleteLabel: 'Delete comparison', deleteTestid: 'comparison-delete' } })
    const remove = wrapper.find('[data-testid="comparison-delete"]')
    expect(remove.text()).toBe('Delete comparison')
    await remove.trigger('click')
    expect(wrapper.emitted('delete')).toEqual([[]])
  })
})
