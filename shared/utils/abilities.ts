import type { MailKind } from './outbox'
import type { Role } from './roles'

// One small predicate per permission, used by the API routes (authoritative) and by pages (cosmetic).
// Scoping to the actor's workshop is done in SQL by the routes; these predicates decide what a role
// may do with a row it can already see.

export interface Actor {
  id: number
  role: Role
  workshopId: number
}

interface OwnedByDriver {
  ownerId: number
}

// What a predicate that looks only at the role needs: a signed-in actor, a session user or a stored
// member row all fit.
export type HasRole = Pick<Actor, 'role'>

const STAFF: readonly Role[] = ['owner', 'tuner', 'fabricator']
// The people who read logs and decide on pulls: the owner and the tuner.
const LOG_READERS: readonly Role[] = ['owner', 'tuner']

// Who someone is (also used on stored member rows, e.g. "is this user a customer").
export const isStaff = (user: HasRole) => STAFF.includes(user.role)
export const isCustomer = (user: HasRole) => user.role === 'driver'
export const isWorkshopOwner = (user: HasRole) => user.role === 'owner'
const readsLogs = (user: HasRole) => LOG_READERS.includes(user.role)

// Members, invites and prices are the owner's.
export const canManageMembers = (actor: HasRole) => isWorkshopOwner(actor)
export const canManagePrices = (actor: HasRole) => isWorkshopOwner(actor)
// Staff pick a car's customer from the list of customers; a customer sees no list of people.
export const canListCustomers = (actor: HasRole) => isStaff(actor)

// Vehicles: staff see every car of the workshop; a driver sees only their own.
export const canSeeAllVehicles = (actor: HasRole) => isStaff(actor)
export const canViewVehicle = (actor: Actor, vehicle: OwnedByDriver) => isStaff(actor) || vehicle.ownerId === actor.id
export const canCreateVehicle = (actor: HasRole) => readsLogs(actor) || isCustomer(actor)
// A customer adds cars to their own account only; the workshop chooses the customer.
export const canChooseCarCustomer = (actor: HasRole) => isStaff(actor)
export const canEditVehicle = (actor: Actor, vehicle: OwnedByDriver) =>
  readsLogs(actor) || (isCustomer(actor) && vehicle.ownerId === actor.id)
// Deleting a car deletes its logs and reports, so it stays with the workshop, not the customer.
export const canDeleteVehicle = (actor: HasRole) => readsLogs(actor)
// Only staff may hand a car to another customer.
export const canReassignVehicle = (actor: HasRole) => readsLogs(actor)

// Logs and their reports follow the car.
export const canViewLog = (actor: Actor, vehicle: OwnedByDriver) => canViewVehicle(actor, vehicle)
export const canUploadLog = (actor: Actor, vehicle: OwnedByDriver) =>
  readsLogs(actor) || (isCustomer(actor) && vehicle.ownerId === actor.id)
// Whether the role uploads logs at all (before a car is chosen, e.g. to detect a file's format).
export const canUploadLogs = (actor: HasRole) => readsLogs(actor) || isCustomer(actor)
export const canEditLog = (actor: Actor, vehicle: OwnedByDriver) => canUploadLog(actor, vehicle)
// The pulls form (add, leave out, full-load rule) is shown to the people who read logs; the
// customer changes the conditions of their own log only.
export const canEditPulls = (actor: Actor, vehicle: OwnedByDriver) => canEditLog(actor, vehicle) && readsLogs(actor)
export const canDeleteLog = (actor: HasRole) => readsLogs(actor)
export const canShareReport = (actor: HasRole) => readsLogs(actor)
export const canCompareLogs = (actor: HasRole) => readsLogs(actor)
// A log profile (a saved column mapping) is the workshop's, kept by the people who read logs.
export const canManageLogProfiles = (actor: HasRole) => readsLogs(actor)
// Which core was fitted when a log was made is the workshop's record, not the customer's.
export const canChangeLogCore = (actor: HasRole) => isStaff(actor)
// Dyno runs are recorded by the people who run the dyno and read the figures.
export const canRecordDynoRuns = (actor: HasRole) => readsLogs(actor)
// The workshop's own evidence per core is for its staff; it never leaves the workshop.
export const canViewCoreEvidence = (actor: HasRole) => isStaff(actor)
// The cautions about hard driving to make a log go to those who make logs on the road.
export const seesLoggingCautions = (actor: HasRole) => actor.role === 'tuner' || isCustomer(actor)

// Core catalogue and quotes are the fabricator's trade.
// Who writes quotes (and is told when a customer pays one).
export const QUOTE_MAKER_ROLES: readonly Role[] = ['owner', 'fabricator']
export const canViewCores = (actor: HasRole) => isStaff(actor)
// Which core is fitted to a car names a catalogue entry, so only staff record it.
export const canSetFittedCore = (actor: HasRole) => isStaff(actor)
export const canManageCores = (actor: HasRole) => QUOTE_MAKER_ROLES.includes(actor.role)
// Sizing reads a car's log and the catalogue; the tuner recommends, the fabricator quotes from it.
export const canSizeCores = (actor: HasRole) => isStaff(actor)
export const canManageQuotes = (actor: HasRole) => QUOTE_MAKER_ROLES.includes(actor.role)
// Staff read every quote of the workshop (the tuner too); a customer only their own.
export const canSeeAllQuotes = (actor: HasRole) => isStaff(actor)
export const canViewQuote = (actor: Actor, quote: { customerId: number }) => canSeeAllQuotes(actor) || quote.customerId === actor.id
// Accepting, declining and paying the deposit are the customer's answers, nobody else's.
export const canAnswerQuote = (actor: Actor, quote: { customerId: number }) => isCustomer(actor) && quote.customerId === actor.id

// The outbox: the owner sees every e-mail of the workshop; the fabricator only the quote and
// payment e-mails their own work sends (invitations and password resets carry sign-in links and
// belong to the people side of the workshop). Everyone else has no outbox.
const FABRICATOR_MAIL_KINDS: readonly MailKind[] = ['quote', 'payment']
export const visibleMailKinds = (actor: HasRole): readonly MailKind[] | 'all' =>
  isWorkshopOwner(actor) ? 'all' : actor.role === 'fabricator' ? FABRICATOR_MAIL_KINDS : []
export const canViewOutbox = (actor: HasRole) => {
  const kinds = visibleMailKinds(actor)
  return kinds === 'all' || kinds.length > 0
}
export const canViewOutboxMail = (actor: HasRole, mail: { kind: string }) => {
  const kinds = visibleMailKinds(actor)
  return kinds === 'all' || (kinds as readonly string[]).includes(mail.kind)
}
