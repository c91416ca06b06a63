import { eq } from 'drizzle-orm'
import { addDaysUtc, quoteTotals, todayUtc } from '#shared/utils/quotes'
import type { Db } from './db'

// The demo's quoted car: a sent quote for the hatchback's front-mount, its e-mail (with the PDF)
// in the outbox, exactly as the send route leaves them. Invented figures.
export async function seedDemoQuote(db: Db, ids: { workshopId: number, fabricatorId: number, vehicleId: number, coreId: number, sizingId?: number }) {
  const workshop = db.select().from(tables.workshops).where(eq(tables.workshops.id, ids.workshopId)).get()!
  const vehicle = db.select().from(tables.vehicles).where(eq(tables.vehicles.id, ids.vehicleId)).get()!
  const customer = db.select().from(tables.users).where(eq(tables.users.id, vehicle.ownerId)).get()!
  const core = db.select().from(tables.cores).where(eq(tables.cores.id, ids.coreId)).get()!
  // The sizing the quote follows from, copied as POST /api/quotes copies it.
  const sizingRow = ids.sizingId ? db.select().from(tables.sizings).where(eq(tables.sizings.id, ids.sizingId)).get() : undefined
  const sizing = sizingRow ? { sizingId: sizingRow.id, logId: sizingRow.logId, design: sizingRow.design, result: sizingRow.result, sizedAt: sizingRow.createdAt.toISOString() } : null
  const lines = [
    { description: `Core: ${core.name}`, quantity: 1, unitPriceCents: core.priceCents ?? 0 },
    { description: 'Charge pipework, aluminium 63 mm, per metre', quantity: 2.4, unitPriceCents: 3250 },
    { description: 'Silicone couplers 63 mm', quantity: 4, unitPriceCents: 1899 },
    { description: 'T-bolt clamps', quantity: 8, unitPriceCents: 349 },
    { description: 'Bumper modification: open the lower grille for the core', quantity: 1, unitPriceCents: 12_000 },
    { description: 'Labour, hours', quantity: 6.5, unitPriceCents: workshop.labourRateCents },
  ]
  const taxRatePct = workshop.taxRatePct
  const depositPct = workshop.depositPercent
  const totals = quoteTotals(lines, taxRatePct, depositPct)
  const today = todayUtc()
  const sentAt = new Date()
  const quote = db.transaction((tx) => {
    const row = tx.insert(tables.quotes).values({
      workshopId: ids.workshopId,
      number: takeQuoteNumber(tx, ids.workshopId, Number(today.slice(0, 4))),
      vehicleId: vehicle.id,
      customerId: customer.id,
      coreId: core.id,
      sizingId: sizingRow?.id ?? null,
      sizing,
      currency: workshop.currency,
      subtotalCents: totals.subtotalCents,
      taxRatePct,
      taxCents: totals.taxCents,
      totalCents: totals.totalCents,
      depositPct,
      depositCents: totals.depositCents,
      validUntil: addDaysUtc(today, workshop.quoteValidityDays),
      terms: workshop.quoteTerms || 'Work is booked in once the deposit is paid. The balance is due when the car is collected. Parts ordered for this job are not returnable.',
      notes: 'Customer reports the power fading on the third hard pull; the hot-day log agrees.',
      createdById: ids.fabricatorId,
    }).returning().get()
    writeQuoteLines(tx, row.id, lines)
    recordAudit(tx, { workshopId: ids.workshopId, userId: ids.fabricatorId, action: 'created', entity: 'quote', entityId: row.id, detail: { number: row.number, demo: true } })
    return row
  })
  const { bytes, filename } = await quotePdfFor({ ...quote, sentAt })
  db.transaction((tx) => {
    moveQuote(tx, quote, 'send', ids.fabricatorId, { sentAt }, { to: customer.email })
    queueMail(tx, {
      workshopId: ids.workshopId,
      to: customer.email,
      subject: `Quote ${quote.number} from ${workshop.name}`,
      kind: 'quote',
      text: `Hello ${customer.name},\n\n${workshop.name} has quoted the front-mount for your ${vehicle.description}: quote ${quote.number}, attached as a PDF.\n\nSign in to Densitas to accept or decline it, and to pay the deposit: ${appLink(`/quotes/${quote.id}`)}`,
      attachments: [{ filename, contentType: 'application/pdf', content: bytes }],
    })
  })
}
