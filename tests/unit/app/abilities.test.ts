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

  it('lets owner and fabricator change the catalogue, the tuner read it, and every staff role size a core', () => {
    for (const role of ROLES) {
      expect(abilities.canViewCores(actor(role))).toBe(role !== 'driver')
      expect(abilities.canManageCores(actor(role))).toBe(role === 'owner' || role === 'fabricator')
      expect(abilities.canSizeCores(actor(role))).toBe(role !== 'driver')
    }
  })

  it('lets only staff record which core is fitted to a car', () => {
    for (const role of ['owner', 'tuner', 'fabricator'] as const) expect(abilities.canSetFittedCore(actor(role))).toBe(true)
    expect(abilities.canSetFittedCore(actor('driver'))).toBe(false)
  })

  it('keeps deleting a car with the workshop, not the customer', () => {
    expect(abilities.canDeleteVehicle(actor('driver'))).toBe(false)
    expect(abilities.canDeleteVehicle(actor('tuner'))).toBe(true)
  })

  it('opens the whole outbox to the owner and only the quote e-mails to the fabricator', () => {
    expect(abilities.visibleMailKinds(actor('owner'))).toBe('all')
    expect(abilities.canViewOutbox(actor('owner'))).toBe(true)
    expect(abilities.canViewOutbox(actor('fabricator'))).toBe(true)
    expect(abilities.canViewOutbox(actor('tuner'))).toBe(false)
    expect(abilities.canViewOutbox(actor('driver'))).toBe(false)
    for (const kind of ['invite', 'password-reset', 'report-share', 'quote', 'payment']) {
      expect(abilities.canViewOutboxMail(actor('owner'), { kind })).toBe(true)
      expect(abilities.canViewOutboxMail(actor('fabricator'), { kind })).toBe(kind === 'quote' || kind === 'payment')
      expect(abilities.canViewOutboxMail(actor('tuner'), { kind })).toBe(false)
      expect(abilities.canViewOutboxMail(actor('driver'), { kind })).toBe(false)
    }
  })

  it('shows a customer their own quotes only', () => {
    expect(abilities.canViewQuote(actor('driver'), { customerId: 10 })).toBe(true)
    expect(abilities.canViewQuote(actor('driver'), { customerId: 11 })).toBe(false)
    // The tuner reads quotes (to see what was offered for the car) but does not write them.
    expect(abilities.canViewQuote(actor('tuner'), { customerId: 11 })).toBe(true)
    expect(abilities.canManageQuotes(actor('tuner'))).toBe(false)
    expect(abilities.canManageQuotes(actor('owner'))).toBe(true)
    expect(abilities.canManageQuotes(actor('driver'))).toBe(false)
  })

  it('lets only the quote\'s own customer accept, decline or pay it', () => {
    expect(abilities.canAnswerQuote(actor('driver'), { customerId: 10 })).toBe(true)
    expect(abilities.canAnswerQuote(actor('driver'), { customerId: 11 })).toBe(false)
    for (const role of ['owner', 'tuner', 'fabricator'] as const) {
      expect(abilities.canAnswerQuote(actor(role), { customerId: 10 })).toBe(false)
    }
  })

  it('lets the owner and tuner build and delete comparisons; everyone who sees the car reads them', () => {
    for (const role of ROLES) expect(abilities.canCompareLogs(actor(role))).toBe(role === 'owner' || role === 'tuner')
  })

  it('lets staff, not the customer, record which core a log was made with', () => {
    for (const role of ROLES) expect(abilities.canChangeLogCore(actor(role))).toBe(role !== 'driver')
  })

  it('lets the owner and tuner record dyno runs', () => {
    for (const role of ROLES) expect(abilities.canRecordDynoRuns(actor(role))).toBe(role === 'owner' || role === 'tuner')
  })

  it('keeps the evidence per core with the workshop\'s staff', () => {
    for (const role of ROLES) expect(abilities.canViewCoreEvidence(actor(role))).toBe(role !== 'driver')
  })

  it('tells a customer, the workshop owner and the staff apart, on actors and stored member rows alike', () => {
    for (const role of ROLES) {
      expect(abilities.isCustomer({ role })).toBe(role === 'driver')
      expect(abilities.isWorkshopOwner({ role })).toBe(role === 'owner')
      expect(abilities.isStaff({ role })).toBe(role !== 'driver')
    }
  })

  it('lets staff list and choose customers, and a customer only add a car to their own account', () => {
    for (const role of ROLES) {
      expect(abilities.canListCustomers(actor(role))).toBe(role !== 'driver')
      expect(abilities.canChooseCarCustomer(actor(role))).toBe(role !== 'driver')
      expect(abilities.canCreateVehicle(actor(role))).toBe(role !== 'fabricator')
    }
  })

  it('lets owner, tuner and customer upload logs, and only owner and tuner keep log profiles', () => {
    for (const role of ROLES) {
      expect(abilities.canUploadLogs(actor(role))).toBe(role !== 'fabricator')
      expect(abilities.canManageLogProfiles(actor(role))).toBe(role === 'owner' || role === 'tuner')
    }
  })

  it('shows the pulls form to owner and tuner, not to the customer who may change their own log', () => {
    expect(abilities.canEditLog(actor('driver'), ownCar)).toBe(true)
    expect(abilities.canEditPulls(actor('driver'), ownCar)).toBe(false)
    expect(abilities.canEditPulls(actor('tuner'), otherCar)).toBe(true)
    expect(abilities.canEditPulls(actor('owner'), otherCar)).toBe(true)
    expect(abilities.canEditPulls(actor('fabricator'), otherCar)).toBe(false)
  })

  it('gives the road-logging cautions to the tuner and the customer, and quotes to owner and fabricator', () => {
    for (const role of ROLES) {
      expect(abilities.seesLoggingCautions(actor(role))).toBe(role === 'tuner' || role === 'driver')
      expect(abilities.canSeeAllQuotes(actor(role))).toBe(role !== 'driver')
      expect(abilities.QUOTE_MAKER_ROLES.includes(role)).toBe(role === 'owner' || role === 'fabricator')
    }
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
    expect(labels('owner')).toEqual(['Overview', 'Cars', 'Logs', 'Core catalogue', 'Quotes', 'People', 'Workshop & prices', 'Outbox', 'My account'])
    expect(labels('tuner')).toEqual(['Overview', 'Cars', 'Logs', 'Core catalogue', 'Quotes', 'My account'])
    expect(labels('fabricator')).toEqual(['Overview', 'Cars', 'Logs', 'Core catalogue', 'Quotes', 'Outbox', 'My account'])
    expect(labels('driver')).toEqual(['My cars', 'My account'])
  })
})
