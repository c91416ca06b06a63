import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { CORRECTION_STANDARDS } from '../../db/schema'
import { CURRENCIES } from '#shared/utils/currencies'

const body = z.object({
  name: z.string().trim().min(2, 'the workshop name needs at least 2 characters').max(120, 'keep the workshop name under 120 characters').optional(),
  currency: z.enum(CURRENCIES).optional(),
  labourRateCents: z.number().int().min(0).max(10_000_000).optional(),
  depositPercent: z.number().int().min(0, 'deposit is 0–100 %').max(100, 'deposit is 0–100 %').optional(),
  correctionStandard: z.enum(CORRECTION_STANDARDS, { message: 'choose one of the listed correction standards' }).optional(),
}).strict()

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canManagePrices(actor)) forbidden('Only the workshop owner changes the workshop\'s name and prices.')
  const changes = await readBodyWith(event, body)
  if (Object.keys(changes).length === 0) badRequest('Nothing to change: send the name, currency, labour rate or deposit share.')
  return useDb().transaction((tx) => {
    // Only the keys sent: the schema has no defaults, so absent fields stay as they are.
    const row = tx.update(tables.workshops).set(changes).where(eq(tables.workshops.id, actor.workshopId)).returning().get()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'updated', entity: 'workshop', entityId: actor.workshopId, detail: changes })
    return row
  })
})
