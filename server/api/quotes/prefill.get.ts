import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { addDaysUtc, todayUtc } from '#shared/utils/quotes'

const query = z.object({
  vehicleId: z.coerce.number().int().positive().optional(),
  coreId: z.coerce.number().int().positive().optional(),
  sizingId: z.coerce.number().int().positive().optional(),
})

// What the new-quote page starts from: the workshop's defaults (rates, deposit, validity, terms,
// labour rate), the picked core's sell price, and the sizing's figures for that core.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  requireQuoteWriter(actor)
  const { vehicleId, coreId: askedCoreId, sizingId } = readQueryWith(event, query)
  const db = useDb()
  const workshop = db.select().from(tables.workshops).where(eq(tables.workshops.id, actor.workshopId)).get()!
  const sizing = sizingId && vehicleId
    ? db.select().from(tables.sizings).where(and(eq(tables.sizings.id, sizingId), eq(tables.sizings.workshopId, actor.workshopId), eq(tables.sizings.vehicleId, vehicleId))).get() ?? null
    : null
  // Without a core in the address, the sizing's first-ranked candidate is the one quoted.
  const candidates = (sizing?.result as { candidates?: Array<{ coreId: number, rank: number }> } | undefined)?.candidates ?? []
  const coreId = askedCoreId ?? candidates.find(c => c.rank === 1)?.coreId
  const core = coreId ? db.select().from(tables.cores).where(and(eq(tables.cores.id, coreId), eq(tables.cores.workshopId, actor.workshopId))).get() ?? null : null
  const sizingText = sizing && core ? sizingNote({ design: sizing.design, result: sizing.result }, core.id, core.name) : null
  return {
    currency: workshop.currency,
    taxRatePct: workshop.taxRatePct,
    depositPct: workshop.depositPercent,
    labourRateCents: workshop.labourRateCents,
    validUntil: addDaysUtc(todayUtc(), workshop.quoteValidityDays),
    terms: workshop.quoteTerms,
    core: core && !core.retiredAt ? { id: core.id, name: core.name, priceCents: core.priceCents, faceWidthMm: core.faceWidthMm, faceHeightMm: core.faceHeightMm, depthMm: core.depthMm } : null,
    sizing: sizing ? { id: sizing.id, note: sizingText } : null,
  }
})
