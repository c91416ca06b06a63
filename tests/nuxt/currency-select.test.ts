import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import { CURRENCIES } from '#shared/utils/currencies'
import CurrencySelect from '~/components/workshop/CurrencySelect.vue'

describe('WorkshopCurrencySelect', () => {
  it('lists every currency code the workshop can price in, with the current one chosen', async () => {
    const wrapper = await mountSuspended(CurrencySelect, { props: { modelValue: 'GBP' }, attrs: { id: 'currency' } })
    expect(wrapper.findAll('option').map(o => o.text())).toEqual([...CURRENCIES])
    expect((wrapper.find('select').element as HTMLSelectElement).value).toBe('GBP')
    expect(wrapper.find('select').attributes('id')).toBe('currency')
  })

  it('says the code that was picked', async () => {
    const wrapper = await mountSuspended(CurrencySelect, { props: { modelValue: 'EUR' } })
    await wrapper.find('select').setValue('CHF')
    expect(wrapper.emitted('update:modelValue')).toEqual([['CHF']])
  })
})
