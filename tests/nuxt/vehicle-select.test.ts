import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import VehicleSelect from '~/components/vehicle/VehicleSelect.vue'

const vehicles = [
  { id: 4, description: '2.0 L four-cylinder turbo-diesel hatchback', registration: 'KD·1123' },
  { id: 8, description: '3.0 L six-cylinder turbo-diesel pickup', registration: '' },
]

describe('VehicleSelect', () => {
  it('asks for a car with a prompt that cannot be picked, then lists each car with its registration', async () => {
    const wrapper = await mountSuspended(VehicleSelect, { props: { modelValue: null, vehicles, prompt: 'Choose the car' }, attrs: { id: 'vehicle', required: true } })
    const options = wrapper.findAll('option')
    expect(options.map(o => o.text())).toEqual(['Choose the car', '2.0 L four-cylinder turbo-diesel hatchback · KD·1123', '3.0 L six-cylinder turbo-diesel pickup'])
    expect(options[0]!.attributes('disabled')).toBeDefined()
    expect(wrapper.find('select').attributes('id')).toBe('vehicle')
    expect(wrapper.find('select').attributes('required')).toBeDefined()
  })

  it('says the picked car as its number id', async () => {
    const wrapper = await mountSuspended(VehicleSelect, { props: { modelValue: 4, vehicles, prompt: 'Pick the car' } })
    const select = wrapper.find('select').element as HTMLSelectElement
    expect(select.options[select.selectedIndex]!.text).toMatch(/^2\.0 L/)
    select.selectedIndex = 2
    await wrapper.find('select').trigger('change')
    expect(wrapper.emitted('update:modelValue')).toEqual([[8]])
  })
})
