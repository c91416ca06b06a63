import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import UiNumberField from '~/components/ui/UiNumberField.vue'

describe('UiNumberField', () => {
  it('labels the box with its unit, tied to the input, and shows the hint', async () => {
    const wrapper = await mountSuspended(UiNumberField, {
      props: { id: 'core-width', label: 'Face width', unit: 'mm', hint: '100–1200 mm', modelValue: null, step: '1', min: 100, max: 1200, required: true, inputmode: 'numeric' },
    })
    const label = wrapper.find('label')
    expect(label.text()).toBe('Face width (mm)')
    expect(label.attributes('for')).toBe('core-width')
    const input = wrapper.find('input')
    expect(input.attributes()).toMatchObject({ id: 'core-width', type: 'number', step: '1', min: '100', max: '1200', inputmode: 'numeric' })
    expect(input.attributes('required')).toBeDefined()
    expect(input.attributes('aria-invalid')).toBeUndefined()
    expect(wrapper.text()).toContain('100–1200 mm')
  })

  it('shows the error instead of the hint and marks the box invalid', async () => {
    const wrapper = await mountSuspended(UiNumberField, {
      props: { id: 'core-depth', label: 'Depth', unit: 'mm', hint: 'front to back', error: 'Enter the core depth in mm.', modelValue: null },
    })
    expect(wrapper.text()).toContain('Enter the core depth in mm.')
    expect(wrapper.text()).not.toContain('front to back')
    expect(wrapper.find('input').attributes('aria-invalid')).toBe('true')
  })

  it('keeps a label without a unit as it is, and leaves out what was not asked for', async () => {
    const wrapper = await mountSuspended(UiNumberField, { props: { id: 'dyno-torque', label: 'Torque (Nm, optional)', modelValue: null } })
    expect(wrapper.find('label').text()).toBe('Torque (Nm, optional)')
    const attributes = wrapper.find('input').attributes()
    expect(attributes).not.toHaveProperty('required')
    expect(attributes).not.toHaveProperty('min')
    expect(attributes).not.toHaveProperty('inputmode')
  })

  it('shows the value and says what was typed as a number', async () => {
    const wrapper = await mountSuspended(UiNumberField, { props: { id: 'quote-tax', label: 'Tax rate', unit: '%', modelValue: 20 } })
    const input = wrapper.find('input')
    expect((input.element as HTMLInputElement).value).toBe('20')
    await input.setValue('19.5')
    expect(wrapper.emitted('update:modelValue')).toEqual([[19.5]])
  })
})
