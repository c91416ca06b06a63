import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import CoreSelect from '~/components/core/CoreSelect.vue'

const cores = [{ id: 3, name: 'Bar-and-plate front-mount 600' }, { id: 9, name: 'Compact tube-and-fin 450' }]

describe('CoreSelect', () => {
  it('offers "Not recorded" first, then every core by name', async () => {
    const wrapper = await mountSuspended(CoreSelect, { props: { modelValue: null, cores } })
    const options = wrapper.findAll('option')
    expect(options.map(o => o.text())).toEqual(['Not recorded', 'Bar-and-plate front-mount 600', 'Compact tube-and-fin 450'])
    expect((wrapper.find('select').element as HTMLSelectElement).selectedIndex).toBe(0)
  })

  it('shows the chosen core and says the choice as a number id, or null for none', async () => {
    const wrapper = await mountSuspended(CoreSelect, { props: { modelValue: 9, cores } })
    const select = wrapper.find('select').element as HTMLSelectElement
    expect(select.options[select.selectedIndex]!.text).toBe('Compact tube-and-fin 450')
    select.selectedIndex = 1
    await wrapper.find('select').trigger('change')
    select.selectedIndex = 0
    await wrapper.find('select').trigger('change')
    expect(wrapper.emitted('update:modelValue')).toEqual([[3], [null]])
  })

  it('takes its own word for none, and passes id, aria-label and test id to the select', async () => {
    const wrapper = await mountSuspended(CoreSelect, {
      props: { modelValue: null, cores: undefined, noneLabel: 'No core' },
      attrs: { 'id': 'quote-core', 'aria-label': 'Core', 'data-testid': 'the-core' },
    })
    expect(wrapper.findAll('option').map(o => o.text())).toEqual(['No core'])
    const select = wrapper.find('select')
    expect(select.attributes('id')).toBe('quote-core')
    expect(select.attributes('aria-label')).toBe('Core')
    expect(select.attributes('data-testid')).toBe('the-core')
  })
})
