import { and, eq, type SQL } from 'drizzle-orm'
import { z } from 'zod'
import { canSeeAllVehicles, type Actor } from '#shared/utils/abilities'
import { FUELS } from '../../db/schema'

export const vehicleFields = z.object({
  description: z.string().trim().min(3, 'describe the car in a few words, e.g. "2.0 L four-cylinder turbo-diesel hatchback"').max(160),
  registration: z.string().trim().max(20).default(''),
  displacementL: z.number({ message: 'enter the engine size in litres' }).min(0.5, 'engine size is in litres: at least 0.5').max(10, 'engine size is in litres: at most 10'),
  cylinders: z.number().int('cylinders is a whole number').min(1).max(16),
  fuel: z.enum(FUELS, { message: 'fuel is diesel or petrol' }),
  ratedPowerKw: z.number().positive('rated power must be above 0 kW').max(2000).nullable().default(null),
  fittedCoreId: z.number().int().positive().nullable().default(null),
  ownerId: z.number().int().positive().optional(),
  notes: z.string().max(2000).default(''),
})

// The SQL condition that limits vehicles to what the actor may see: their workshop, and for a
// driver only their own cars. Everything else does not exist for them (404).
export function visibleVehicles(actor: Actor): SQL {
  const inWorkshop = eq(tables.vehicles.workshopId, actor.workshopId)
  return canSeeAllVehicles(actor) ? inWorkshop : and(inWorkshop, eq(tables.vehicles.ownerId, actor.id))!
}

export function findVisibleVehicle(actor: Actor, id: number) {
  const vehicle = useDb().select().from(tables.vehicles).where(and(eq(tables.vehicles.id, id), visibleVehicles(actor))).get()
  if (!vehicle) notFound('Vehicle')
  return vehicle
}

// A car belongs to a customer account of the same workshop.
export function assertDriverOfWorkshop(actor: Actor, ownerId: number) {
  const owner = useDb().select().from(tables.users).where(and(eq(tables.users.id, ownerId), eq(tables.users.workshopId, actor.workshopId))).get()
  if (!owner) badRequest('ownerId: no customer with that id in your workshop. Pick the customer from the list, or invite them first.')
  if (owner.role !== 'driver') badRequest('ownerId: a car belongs to a customer (driver) account. Pick a customer, not a staff member.')
}

// A retired core is not offered for new fitting; a car that already has it may keep it.
export function assertCoreOfWorkshop(actor: Actor, coreId: number | null | undefined, currentCoreId?: number | null) {
  if (coreId == null) return
  const core = useDb().select({ id: tables.cores.id, retiredAt: tables.cores.retiredAt }).from(tables.cores).where(and(eq(tables.cores.id, coreId), eq(tables.cores.workshopId, actor.workshopId))).get()
  if (!core) badRequest('fittedCoreId: no core with that id in your catalogue. Pick one from the core catalogue or leave it empty.')
  if (core.retiredAt && coreId !== currentCoreId) badRequest('Fitted core: that core is retired from the catalogue. Pick a current core, or bring it back in the catalogue first.')
}
