import { and, eq, type SQL } from 'drizzle-orm'
import { z } from 'zod'
import { canSeeAllVehicles, isCustomer, type Actor } from '#shared/utils/abilities'
import { FUELS } from '../../db/schema'

// The fields of a car, without defaults: a patch derives from this with .partial(), so a key the
// request leaves out stays absent (a default here would overwrite the stored value with '' or null).
const vehicleBase = z.object({
  description: z.string().trim().min(3, 'describe the car in a few words, e.g. "2.0 L four-cylinder turbo-diesel hatchback"').max(160, 'keep the description under 160 characters'),
  registration: z.string().trim().max(20, 'a registration has at most 20 characters'),
  displacementL: z.number({ message: 'enter the engine size in litres' }).min(0.5, 'engine size is in litres: at least 0.5').max(10, 'engine size is in litres: at most 10'),
  cylinders: z.number().int('cylinders is a whole number').min(1).max(16),
  fuel: z.enum(FUELS, { message: 'fuel is diesel or petrol' }),
  ratedPowerKw: z.number().positive('rated power must be above 0 kW').max(2000).nullable(),
  fittedCoreId: z.number().int().positive().nullable(),
  ownerId: z.number().int().positive().optional(),
  notes: z.string().max(2000, 'keep the notes under 2000 characters'),
})

// A new car: what is not sent starts empty (the fitted core stays absent, so a customer's form,
// which cannot send one, is told apart from someone choosing "none").
export const vehicleFields = vehicleBase.extend({
  registration: vehicleBase.shape.registration.default(''),
  ratedPowerKw: vehicleBase.shape.ratedPowerKw.default(null),
  fittedCoreId: vehicleBase.shape.fittedCoreId.optional(),
  notes: vehicleBase.shape.notes.default(''),
})

// A change to a car: only the keys sent.
export const vehiclePatch = vehicleBase.partial().strict()

// The SQL condition that limits vehicles to what the actor may see: their workshop, and for a
// driver only their own cars. Everything else does not exist for them (404).
export function visibleVehicles(actor: Actor): SQL {
  const inWorkshop = eq(tables.vehicles.workshopId, actor.workshopId)
  return canSeeAllVehicles(actor) ? inWorkshop : and(inWorkshop, eq(tables.vehicles.ownerId, actor.id))!
}

export function findVisibleVehicle(actor: Actor, id: number) {
  const vehicle = useDb().select().from(tables.vehicles).where(and(eq(tables.vehicles.id, id), visibleVehicles(actor))).get()
  if (!vehicle) notFound('Car', actor)
  return vehicle
}

// A car belongs to a customer account of the same workshop.
export function assertDriverOfWorkshop(actor: Actor, ownerId: number) {
  const owner = useDb().select().from(tables.users).where(and(eq(tables.users.id, ownerId), eq(tables.users.workshopId, actor.workshopId))).get()
  if (!owner) badRequest('Customer: that customer is not in your workshop. Pick the customer from the list, or invite them first.')
  if (!isCustomer(owner)) badRequest('Customer: a car belongs to a customer. Pick a customer, not one of the workshop\'s staff.')
}

// The core catalogue is staff-only, so only staff say which core is fitted. A retired core is not
// offered for new fitting; a car that already has it may keep it.
export function assertCoreOfWorkshop(actor: Actor, coreId: number | null | undefined, currentCoreId?: number | null) {
  if (coreId === undefined) return
  if (!canSetFittedCore(actor)) forbidden('Only the workshop sets which intercooler core is fitted. Ask a tuner to record it.')
  if (coreId === null) return
  const core = useDb().select({ id: tables.cores.id, retiredAt: tables.cores.retiredAt }).from(tables.cores).where(and(eq(tables.cores.id, coreId), eq(tables.cores.workshopId, actor.workshopId))).get()
  if (!core) badRequest('Fitted core: that core is not in your catalogue. Pick one from the core catalogue or leave it empty.')
  if (core.retiredAt && coreId !== currentCoreId) badRequest('Fitted core: that core is retired from the catalogue. Pick a current core, or bring it back in the catalogue first.')
}
