import { describe, expect, it } from 'vitest'
import * as abilities from '../../../shared/utils/abilities'
import { navigationFor } from '../../../shared/utils/navigation'
import { ROLES, isRole, type Role } from '../../../shared/utils/roles'

const actor = (role: Role, id = 10) => ({ id, role, workshopId: 1 })
const ownCar = { ownerId: 10 }
const otherCar = { ownerId: 99 }

describe('abilities', () => {
  it('gives members and prices to the owner alone', () => {
    for (const role of ROLES) {
      expect(abilities.canManageMembers(actor(role))).toBe(role === 'owner')
      expect(abilities.canManagePrices(actor(role))).toBe(role === 'owner')
    }
  })

  it('lets staff see every car and a driver only their own', () => {
    for (const role of ['owner', 'tuner', 'fabricator'] as const) {
      expect(abilities.canViewVehicle(actor(role), otherCar)).toBe(true)
    }
    expect(abilities.canViewVehicle(actor('driver'), ownCar)).toBe(true)
    expect(abilities.canViewVehicle(actor('driver'), otherCar)).toBe(false)
  })

  it('lets the fabricator read cars but not change them', () => {
    expect(abilities.canEditVehicle(actor('fabricator'), ownCar)).toBe(false)
    expect(abilities.canCreateVehicle(actor('fabricator'))).toBe(false)
    expect(abilities.canManageCores(actor('fabricator'))).toBe(true)
    expect(abilities.canManageQuotes(actor('fabricator'))).toBe(true)
  })

  it('lets only staff record which core is fitted to a car', () => {
    for (const role of ['owner', 'tuner', 'fabricator'] as const) expect(abilities.canSetFittedCore(actor(role))).toBe(true)
    expect(abilities.canSetFittedCore(actor('driver'))).toBe(false)
  })

  it('keeps deleting a car with the workshop, not the customer', () => {
    expect(abilities.canDeleteVehicle(actor('driver'))).toBe(false)
    expect(abilities.canDeleteVehicle(actor('tuner'))).toBe(true)
  })

  it('shows a customer their own quotes only', () => {
    expect(abilities.canViewQuote(actor('driver'), { customerId: 10 })).toBe(true)
    expect(abilities.canViewQuote(actor('driver'), { customerId: 11 })).toBe(false)
    expect(abilities.canViewQuote(actor('tuner'), { customerId: 11 })).toBe(false)
  })

  it('recognises the four roles and nothing else', () => {
    expect(ROLES.every(isRole)).toBe(true)
    expect(isRole('admin')).toBe(false)
    expect(isRole(undefined)).toBe(false)
  })
})

describe('navigation', () => {
  it('offers each role only the places it can use', () => {
    const labels = (role: Role) => navigationFor(role).map(item => item.label)
    expect(labels('owner')).toEqual(['Overview', 'Cars', 'Logs', 'Core catalogue', 'People', 'Workshop & prices', 'My account'])
    expect(labels('tuner')).toEqual(['Overview', 'Cars', 'Logs', 'My account'])
    expect(labels('fabricator')).toEqual(['Overview', 'Cars', 'Logs', 'Core catalogue', 'My account'])
    expect(labels('driver')).toEqual(['My cars', 'My account'])
  })
})
