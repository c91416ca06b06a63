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

const STAFF: readonly Role[] = ['owner', 'tuner', 'fabricator']

export const isStaff = (actor: Actor) => STAFF.includes(actor.role)

// Members, invites and prices are the owner's.
export const canManageMembers = (actor: Actor) => actor.role === 'owner'
export const canManagePrices = (actor: Actor) => actor.role === 'owner'

// Vehicles: staff see every car of the workshop; a driver sees only their own.
export const canSeeAllVehicles = (actor: Actor) => isStaff(actor)
export const canViewVehicle = (actor: Actor, vehicle: OwnedByDriver) => isStaff(actor) || vehicle.ownerId === actor.id
export const canCreateVehicle = (actor: Actor) => actor.role === 'owner' || actor.role === 'tuner' || actor.role === 'driver'
export const canEditVehicle = (actor: Actor, vehicle: OwnedByDriver) =>
  actor.role === 'owner' || actor.role === 'tuner' || (actor.role === 'driver' && vehicle.ownerId === actor.id)
// Deleting a car deletes its logs and reports, so it stays with the workshop, not the customer.
export const canDeleteVehicle = (actor: Actor) => actor.role === 'owner' || actor.role === 'tuner'
// Only staff may hand a car to another customer.
export const canReassignVehicle = (actor: Actor) => actor.role === 'owner' || actor.role === 'tuner'

// Logs and their reports follow the car.
export const canViewLog = (actor: Actor, vehicle: OwnedByDriver) => canViewVehicle(actor, vehicle)
export const canUploadLog = (actor: Actor, vehicle: OwnedByDriver) =>
  actor.role === 'owner' || actor.role === 'tuner' || (actor.role === 'driver' && vehicle.ownerId === actor.id)
export const canEditLog = (actor: Actor, vehicle: OwnedByDriver) => canUploadLog(actor, vehicle)
export const canDeleteLog = (actor: Actor) => actor.role === 'owner' || actor.role === 'tuner'
export const canShareReport = (actor: Actor) => actor.role === 'owner' || actor.role === 'tuner'
export const canCompareLogs = (actor: Actor) => actor.role === 'owner' || actor.role === 'tuner'
// Which core was fitted when a log was made is the workshop's record, not the customer's.
export const canChangeLogCore = (actor: Actor) => isStaff(actor)
// Dyno runs are recorded by the people who run the dyno and read the figures.
export const canRecordDynoRuns = (actor: Actor) => actor.role === 'owner' || actor.role === 'tuner'
// The workshop's own evidence per core is for its staff; it never leaves the workshop.
export const canViewCoreEvidence = (actor: Actor) => isStaff(actor)

// Core catalogue and quotes are the fabricator's trade.
export const canViewCores = (actor: Actor) => isStaff(actor)
// Which core is fitted to a car names a catalogue entry, so only staff record it.
export const canSetFittedCore = (actor: Actor) => isStaff(actor)
export const canManageCores = (actor: Actor) => actor.role === 'owner' || actor.role === 'fabricator'
// Sizing reads a car's log and the catalogue; the tuner recommends, the fabricator quotes from it.
export const canSizeCores = (actor: Actor) => isStaff(actor)
export const canManageQuotes = (actor: Actor) => actor.role === 'owner' || actor.role === 'fabricator'
// Staff read every quote of the workshop (the tuner too); a customer only their own.
export const canViewQuote = (actor: Actor, quote: { customerId: number }) => isStaff(actor) || quote.customerId === actor.id
// Accepting, declining and paying the deposit are the customer's answers, nobody else's.
export const canAnswerQuote = (actor: Actor, quote: { customerId: number }) => actor.role === 'driver' && quote.customerId === actor.id

// The outbox: the owner sees every e-mail of the workshop; the fabricator only the quote and
// payment e-mails their own work sends (invitations and password resets carry sign-in links and
// belong to the people side of the workshop). Everyone else has no outbox.
const FABRICATOR_MAIL_KINDS: readonly MailKind[] = ['quote', 'payment']
export const visibleMailKinds = (actor: Actor): readonly MailKind[] | 'all' =>
  actor.role === 'owner' ? 'all' : actor.role === 'fabricator' ? FABRICATOR_MAIL_KINDS : []
export const canViewOutbox = (actor: Actor) => {
  const kinds = visibleMailKinds(actor)
  return kinds === 'all' || kinds.length > 0
}
export const canViewOutboxMail = (actor: Actor, mail: { kind: string }) => {
  const kinds = visibleMailKinds(actor)
  return kinds === 'all' || (kinds as readonly string[]).includes(mail.kind)
}
