import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import { CORE_CONSTRUCTIONS, CORE_CONSTRUCTION_LABELS, CORE_KINDS, CORE_KIND_LABELS } from '#shared/utils/cores'
import UiOptionSelect from '~/components/ui/UiOptionSelect.vue'

describe('UiOptionSelect', () => {
  it('shows each value by its label, with no empty choice unless asked', async () => {
    const wrapper = await mountSuspended(UiOptionSelect, {
      props: { modelValue: CORE_KINDS[0], options: CORE_KINDS, labels: CORE_KIND_LABELS },
      attrs: { id: 'core-kind' },
    })
    expect(wrapper.findAll('option').map(o => o.text())).toEqual(CORE_KINDS.map(kind => CORE_KIND_LABELS[kind]))
    expect(wrapper.find('select').attributes('id')).toBe('core-kind')
  })

  it('puts the "not known" choice first and says null for it, the value for the others', async () => {
    const wrapper = await mountSuspended(UiOptionSelect, {
      props: { modelValue: CORE_CONSTRUCTIONS[1], options: CORE_CONSTRUCTIONS, labels: CORE_CONSTRUCTION_LABELS, none: 'Not known' },
    })
    const select = wrapper.find('select').element as HTMLSelectElement
    expect(wrapper.findAll('option').map(o => o.text())).toEqual(['Not known', ...CORE_CONSTRUCTIONS.map(c => CORE_CONSTRUCTION_LABELS[c])])
    expect(select.options[select.selectedIndex]!.text).toBe(CORE_CONSTRUCTION_LABELS[CORE_CONSTRUCTIONS[1]])
    select.selectedIndex = 0
    await wrapper.find('select').trigger('change')
    select.selectedIndex = 1
    await wrapper.find('select').trigger('change')
    expect(wrapper.emitted('update:modelValue')).toEqual([[null], [CORE_CONSTRUCTIONS[0]]])
  })

  it('shows a value as itself when it has no label', async () => {
    const wrapper = await mountSuspended(UiOptionSelect, { props: { modelValue: 'EUR', options: ['EUR', 'GBP'] } })
    expect(wrapper.findAll('option').map(o => o.text())).toEqual(['EUR', 'GBP'])
    await wrapper.find('select').setValue('GBP')
    expect(wrapper.emitted('update:modelValue')).toEqual([['GBP']])
  })
})
