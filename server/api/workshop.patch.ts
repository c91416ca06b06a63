import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { CORRECTION_STANDARDS } from '../../db/schema'
import { CURRENCIES } from '#shared/utils/currencies'
import { hasAtMostTwoDecimals } from '#shared/utils/quotes'

const body = z.object({
  name: z.string().trim().min(2, 'the workshop name needs at least 2 characters').max(120, 'keep the workshop name under 120 characters').optional(),
  currency: z.enum(CURRENCIES).optional(),
  labourRateCents: z.number().int().min(0).max(10_000_000).optional(),
  depositPercent: z.number().int().min(0, 'deposit is 0–100 %').max(100, 'deposit is 0–100 %').optional(),
  correctionStandard: z.enum(CORRECTION_STANDARDS, { message: 'choose one of the listed correction standards' }).optional(),
  // The defaults a new quote starts from; a quote can still be given its own tax rate, date and terms.
  taxRatePct: z.number({ message: 'enter the tax rate in %, 0 to 50' }).min(0, 'the tax rate is 0–50 %').max(50, 'the tax rate is 0–50 %')
    .refine(hasAtMostTwoDecimals, 'the tax rate has at most two decimals (e.g. 8.25 %)').optional(),
  quoteValidityDays: z.number({ message: 'enter how many days a quote is valid, 1 to 365' }).int('a quote is valid for a whole number of days, 1 to 365')
    .min(1, 'a quote is valid for 1 to 365 days').max(365, 'a quote is valid for 1 to 365 days').optional(),
  quoteTerms: z.string({ message: 'write the quote terms as text' }).trim().max(4000, 'keep the quote terms under 4 000 characters').optional(),
}).strict()

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canManagePrices(actor)) forbidden('Only the workshop owner changes the workshop\'s name and prices.')
  const changes = await readBodyWith(event, body)
  if (Object.keys(changes).length === 0) badRequest('Nothing to change: send the name, currency, labour rate, deposit share, tax rate, quote validity or quote terms.')
  return useDb().transaction((tx) => {
    // Only the keys sent: the schema has no defaults, so absent fields stay as they are.
    const row = tx.update(tables.workshops).set(changes).where(eq(tables.workshops.id, actor.workshopId)).returning().get()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'updated', entity: 'workshop', entityId: actor.workshopId, detail: changes })
    return row
  })
})
