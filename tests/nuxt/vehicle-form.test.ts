import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import VehicleForm from '~/components/vehicle/VehicleForm.vue'
import VehicleList from '~/components/vehicle/VehicleList.vue'

describe('VehicleForm', () => {
  it('asks staff to choose the customer, and a driver not', async () => {
    const staff = await mountSuspended(VehicleForm, {
      props: { modelValue: emptyVehicleDraft(), submitLabel: 'Add', customers: [{ id: 4, name: 'Sam', email: 's@x.test' }] },
    })
    expect(staff.find('#owner').exists()).toBe(true)
    const driver = await mountSuspended(VehicleForm, { props: { modelValue: emptyVehicleDraft(), submitLabel: 'Add' } })
    expect(driver.find('#owner').exists()).toBe(false)
  })

  it('writes typed values back into the draft and submits', async () => {
    const draft = emptyVehicleDraft()
    const wrapper = await mountSuspended(VehicleForm, {
      props: { 'modelValue': draft, 'submitLabel': 'Add', 'onUpdate:modelValue': () => {} },
    })
    await wrapper.find('#description').setValue('2.0 L four-cylinder turbo-diesel hatchback')
    await wrapper.find('#displacement').setValue('2.0')
    await wrapper.find('#fuel').setValue('petrol')
    expect(draft.description).toBe('2.0 L four-cylinder turbo-diesel hatchback')
    expect(draft.displacementL).toBe(2)
    expect(draft.fuel).toBe('petrol')
    await wrapper.find('form').trigger('submit')
    expect(wrapper.emitted('submit')).toHaveLength(1)
  })

  it('turns the draft into an API body without an owner or a fitted core for a driver', () => {
    const body = vehicleDraftToBody({ ...emptyVehicleDraft(), ownerId: 7, fittedCoreId: 3, ratedPowerKw: Number.NaN }, false)
    expect(body).not.toHaveProperty('ownerId')
    expect(body).not.toHaveProperty('fittedCoreId')
    expect(body.ratedPowerKw).toBeNull()
    expect(vehicleDraftToBody({ ...emptyVehicleDraft(), ownerId: 7, fittedCoreId: 3 }, true)).toMatchObject({ ownerId: 7, fittedCoreId: 3 })
  })
})

describe('VehicleList', () => {
  it('says so when there are no cars', async () => {
    const wrapper = await mountSuspended(VehicleList, { props: { vehicles: [] } })
    expect(wrapper.find('[data-testid="vehicles-empty"]').text()).toBe('No cars yet.')
  })

  it('lists cars with engine and owner', async () => {
    const wrapper = await mountSuspended(VehicleList, {
      props: {
        showOwner: true,
        vehicles: [{ id: 1, description: '3.0 L six-cylinder turbo-diesel pickup', registration: 'HBF·0420', fuel: 'diesel', displacementL: 3, cylinders: 6, ratedPowerKw: 190, ownerName: 'Ayla Fenwick', fittedCoreName: null }],
      },
    })
    const text = wrapper.text()
    expect(text).toContain('3.0 L, 6 cyl, diesel')
    expect(text).toContain('190 kW')
    expect(text).toContain('Ayla Fenwick')
  })
})
