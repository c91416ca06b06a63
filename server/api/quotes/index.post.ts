import { and, eq } from 'drizzle-orm'
import { addDaysUtc, quoteTotals, todayUtc } from '#shared/utils/quotes'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  requireQuoteWriter(actor)
  const input = await readQuoteBody(event, createQuoteBody)
  const db = useDb()
  // References in the body name rows of the actor's own workshop or nothing (400, without saying
  // whether the id exists elsewhere).
  const vehicle = db.select().from(tables.vehicles).where(and(eq(tables.vehicles.id, input.vehicleId), eq(tables.vehicles.workshopId, actor.workshopId))).get()
  if (!vehicle) badRequest('There is no such car in your workshop. Pick the car from the list.')
  if (input.coreId != null) assertQuotableCore(actor.workshopId, input.coreId)
  let sizing: Record<string, unknown> | null = null
  if (input.sizingId != null) {
    const row = db.select().from(tables.sizings).where(and(eq(tables.sizings.id, input.sizingId), eq(tables.sizings.workshopId, actor.workshopId), eq(tables.sizings.vehicleId, vehicle.id))).get()
    if (!row) badRequest('There is no such sizing for this car. Size the car again, or quote without a sizing.')
    sizing = { sizingId: row.id, logId: row.logId, design: row.design, result: row.result, sizedAt: row.createdAt.toISOString() }
  }
  const workshop = db.select().from(tables.workshops).where(eq(tables.workshops.id, actor.workshopId)).get()!
  const depositPct = input.depositPct ?? workshop.depositPercent
  const taxRatePct = input.taxRatePct ?? workshop.taxRatePct
  const totals = quoteTotals(input.lines, taxRatePct, depositPct)
  const today = todayUtc()

  const quote = db.transaction((tx) => {
    const number = takeQuoteNumber(tx, actor.workshopId, Number(today.slice(0, 4)))
    const row = tx.insert(tables.quotes).values({
      workshopId: actor.workshopId,
      number,
      vehicleId: vehicle.id,
      customerId: vehicle.ownerId,
      coreId: input.coreId ?? null,
      sizingId: input.sizingId ?? null,
      sizing,
      currency: workshop.currency,
      subtotalCents: totals.subtotalCents,
      taxRatePct,
      taxCents: totals.taxCents,
      totalCents: totals.totalCents,
      depositPct,
      depositCents: totals.depositCents,
      validUntil: input.validUntil ?? addDaysUtc(today, workshop.quoteValidityDays),
      terms: input.terms ?? workshop.quoteTerms,
      notes: input.notes ?? '',
      createdById: actor.id,
    }).returning().get()
    writeQuoteLines(tx, row.id, input.lines)
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'created', entity: 'quote', entityId: row.id, detail: { number, vehicleId: vehicle.id, totalCents: row.totalCents, sizingId: row.sizingId } })
    return row
  })
  setResponseStatus(event, 201)
  return { id: quote.id, number: quote.number, status: quote.status, totalCents: quote.totalCents, depositCents: quote.depositCents }
})
