import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { afterEach, describe, expect, it } from 'vitest'
import QuoteList from '~/components/quote/QuoteList.vue'

// One quote, so the table offers its search box.
registerEndpoint('/api/quotes', () => ({
  items: [{ id: 1, number: 'Q-0001', status: 'sent', currency: 'GBP', totalCents: 120000, validUntil: null, vehicle: { id: 3, description: 'Test estate', registration: null }, customer: { id: 9, name: 'Dana Driver' } }],
  total: 1,
  page: 1,
  pageSize: 25,
}))

function signInAs(role: string) {
  useState('nuxt-session').value = { user: { id: 1, role, name: 'Someone', workshopId: 1 }, loggedInAt: Date.now() }
}

describe('QuoteList search hint', () => {
  afterEach(() => {
    useState('nuxt-session').value = null
  })

  it('offers staff a search by customer, and a customer only what fits their own quotes', async () => {
    signInAs('owner')
    const staff = await mountSuspended(QuoteList, { props: { showCar: true } })
    expect(staff.find('input[type="search"]').attributes('placeholder')).toBe('Number, car, registration or customer')
    signInAs('driver')
    const customer = await mountSuspended(QuoteList, { props: { showCar: true } })
    expect(customer.find('input[type="search"]').attributes('placeholder')).toBe('Number, car or registration')
  })

  it('heads the car column "Car" for a customer, without their own name beside each car', async () => {
    signInAs('owner')
    const staff = await mountSuspended(QuoteList, { props: { showCar: true } })
    // A header reads its label, then the sort arrow.
    const label = (th: { text: () => string }) => th.text().replace(/[▲▼↕]/g, '').trim()
    expect(staff.findAll('th').map(label)).toContain('Car and customer')
    expect(staff.text()).toContain('Dana Driver')
    signInAs('driver')
    const customer = await mountSuspended(QuoteList, { props: { showCar: true } })
    const headers = customer.findAll('th').map(label)
    expect(headers).toContain('Car')
    expect(headers).not.toContain('Car and customer')
    expect(customer.text()).not.toContain('Dana Driver')
  })
})
