import type { H3Event } from 'h3'
import { and, asc, eq, inArray, isNotNull, lt, sql, type SQL } from 'drizzle-orm'
import { z } from 'zod'
import { canAnswerQuote, canManageQuotes, isStaff, type Actor } from '#shared/utils/abilities'
import { hasAtMostTwoDecimals, lineAmountCents, nextQuoteState, refusedMoveMessage, todayUtc, type QuoteMove } from '#shared/utils/quotes'
import type { Db } from './db'

export type QuoteRow = typeof tables.quotes.$inferSelect
type Tx = Parameters<Parameters<Db['transaction']>[0]>[0]

// ---- input --------------------------------------------------------------------------------------

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'write the date as YYYY-MM-DD')
  .refine(value => !Number.isNaN(Date.parse(`${value}T00:00:00Z`)) && new Date(`${value}T00:00:00Z`).toISOString().startsWith(value), 'that date does not exist')

const line = z.object({
  description: z.string({ message: 'describe the line' }).trim().min(1, 'describe the line').max(200, 'keep a description under 200 characters'),
  quantity: z.number({ message: 'enter a quantity' }).positive('a quantity is above 0').max(10_000, 'a quantity is at most 10 000')
    .refine(hasAtMostTwoDecimals, 'a quantity has at most two decimals (e.g. 2.5 hours or 1.25 m)'),
  unitPriceCents: z.number({ message: 'enter a unit price' }).int('prices are in whole cents: no fractions of a cent').min(0, 'a price cannot be below 0').max(100_000_000, 'a price is at most 1 000 000.00'),
}).strict()

const percent = (what: string) => z.number({ message: `enter the ${what} in %` }).min(0, `${what} is 0–100 %`).max(100, `${what} is 0–100 %`)
  .refine(hasAtMostTwoDecimals, `${what} has at most two decimals`)

const editable = {
  coreId: z.number().int().positive().nullable(),
  lines: z.array(line, { message: 'add the quote\'s lines' }).min(1, 'a quote needs at least one line').max(60, 'a quote has at most 60 lines'),
  taxRatePct: percent('tax rate'),
  depositPct: percent('deposit share'),
  validUntil: isoDate,
  terms: z.string().max(4000, 'keep the terms under 4 000 characters'),
  notes: z.string().max(2000, 'keep the notes under 2 000 characters'),
}

export const createQuoteBody = z.object({
  vehicleId: z.number({ message: 'pick the car' }).int().positive(),
  sizingId: z.number().int().positive().nullable().optional(),
  coreId: editable.coreId.optional(),
  lines: editable.lines,
  // Left out, the workshop's own tax rate, validity and terms are used (the workshop page sets them).
  taxRatePct: editable.taxRatePct.optional(),
  depositPct: editable.depositPct.optional(),
  validUntil: editable.validUntil.optional(),
  terms: editable.terms.optional(),
  notes: editable.notes.optional(),
}).strict()

export const patchQuoteBody = z.object(editable).partial().strict()

// Field paths in plain words: a person reads "line 2, quantity", not "lines.1.quantity".
const FIELD_WORDS: Record<string, string> = {
  vehicleId: 'car', sizingId: 'sizing', coreId: 'core', lines: 'lines', description: 'description', quantity: 'quantity',
  unitPriceCents: 'unit price', taxRatePct: 'tax rate', depositPct: 'deposit share', validUntil: 'valid until', terms: 'terms', notes: 'notes',
}

function plainIssues(error: z.ZodError) {
  return error.issues.map((issue) => {
    const where = issue.path.map((part, i) => typeof part === 'number' && issue.path[i - 1] === 'lines' ? `line ${part + 1}` : FIELD_WORDS[String(part)] ?? String(part))
      .filter(word => word !== 'lines' || issue.path.length === 1)
    return where.length ? `${where.join(', ')}: ${issue.message}` : issue.message
  }).join('; ')
}

export async function readQuoteBody<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.infer<S>> {
  let body: unknown
  try {
    body = await readBody(event)
  }
  catch {
    badRequest('The form did not arrive in a shape the server can read. Reload the page and try again.')
  }
  const result = schema.safeParse(body ?? {})
  if (!result.success) badRequest(`The quote is not valid — ${plainIssues(result.error)}. Correct it and try again.`, { issues: result.error.issues })
  if (typeof body === 'object' && body && 'validUntil' in body && typeof body.validUntil === 'string' && body.validUntil < todayUtc()) {
    badRequest('The valid-until date is in the past. Pick today or a later day.')
  }
  return result.data
}

// ---- who sees what ------------------------------------------------------------------------------

// Staff see every quote of their workshop; a customer sees only quotes sent to them (never a
// draft that was not sent yet). Everything else does not exist for them (404).
export function visibleQuotes(actor: Actor): SQL {
  const inWorkshop = eq(tables.quotes.workshopId, actor.workshopId)
  return isStaff(actor) ? inWorkshop : and(inWorkshop, eq(tables.quotes.customerId, actor.id), isNotNull(tables.quotes.sentAt))!
}

export function findVisibleQuote(actor: Actor, id: number): QuoteRow {
  expireDueQuotes(actor, id)
  const quote = useDb().select().from(tables.quotes).where(and(eq(tables.quotes.id, id), visibleQuotes(actor))).get()
  if (!quote) notFound('Quote')
  return quote
}

export function assertQuotableCore(workshopId: number, coreId: number) {
  const core = useDb().select().from(tables.cores).where(and(eq(tables.cores.id, coreId), eq(tables.cores.workshopId, workshopId))).get()
  if (!core) badRequest('There is no such core in your catalogue. Pick one from the core catalogue, or quote without one.')
  if (core.retiredAt) badRequest(`The core "${core.name}" is retired and is not offered for new work. Pick another core.`)
  return core
}

export function quoteConflict(message: string): never {
  throw createError({ statusCode: 409, message })
}

export function requireQuoteWriter(actor: Actor) {
  if (!canManageQuotes(actor)) forbidden('Only the fabricator or the workshop owner writes quotes. You can read them.')
}

export function requireQuoteCustomer(actor: Actor, quote: QuoteRow) {
  if (!canAnswerQuote(actor, quote)) forbidden('Only the customer the quote was made for can accept, decline or pay it.')
}

// ---- moves --------------------------------------------------------------------------------------

// A quote past its valid-until day expires on the next read or move; the audit says it was time,
// and who happened to look.
export function expireDueQuotes(actor: Actor, quoteId?: number) {
  const today = todayUtc()
  const db = useDb()
  const where = and(
    eq(tables.quotes.workshopId, actor.workshopId),
    inArray(tables.quotes.status, ['sent', 'accepted']),
    lt(tables.quotes.validUntil, today),
    quoteId === undefined ? undefined : eq(tables.quotes.id, quoteId),
  )
  const due = db.select({ id: tables.quotes.id, status: tables.quotes.status, validUntil: tables.quotes.validUntil }).from(tables.quotes).where(where).all()
  if (!due.length) return
  db.transaction((tx) => {
    for (const quote of due) {
      tx.update(tables.quotes).set({ status: 'expired', updatedAt: new Date() }).where(and(eq(tables.quotes.id, quote.id), eq(tables.quotes.status, quote.status))).run()
      recordAudit(tx, { workshopId: actor.workshopId, userId: null, action: 'expire', entity: 'quote', entityId: quote.id, detail: { from: quote.status, to: 'expired', validUntil: quote.validUntil, noticedBy: actor.id } })
    }
  })
}

// The one place a quote changes state: checks the move against the state machine, writes it only
// if nobody moved the quote meanwhile, and audits who did it and when.
export function moveQuote(tx: Tx, quote: QuoteRow, move: QuoteMove, userId: number | null, changes: Partial<QuoteRow> = {}, detail: Record<string, unknown> = {}) {
  const to = nextQuoteState(quote.status, move)
  if (!to) quoteConflict(refusedMoveMessage(quote.status, move))
  const row = tx.update(tables.quotes)
    .set({ ...changes, status: to, updatedAt: new Date() })
    .where(and(eq(tables.quotes.id, quote.id), eq(tables.quotes.status, quote.status)))
    .returning().get()
  if (!row) quoteConflict('This quote changed while you were looking at it. Reload the page and try again.')
  recordAudit(tx, { workshopId: quote.workshopId, userId, action: move, entity: 'quote', entityId: quote.id, detail: { from: quote.status, to, revision: row.revision, ...detail } })
  return row
}

export function assertMove(quote: QuoteRow, move: QuoteMove) {
  if (!nextQuoteState(quote.status, move)) quoteConflict(refusedMoveMessage(quote.status, move))
}

// ---- reading a whole quote ----------------------------------------------------------------------

export function quoteLinesOf(quoteId: number, db: Pick<Db, 'select'> = useDb()) {
  return db.select().from(tables.quoteLines).where(eq(tables.quoteLines.quoteId, quoteId)).orderBy(asc(tables.quoteLines.position)).all()
}

export function quoteDetail(quote: QuoteRow) {
  const db = useDb()
  const lines = quoteLinesOf(quote.id).map(l => ({ id: l.id, description: l.description, quantity: l.quantity, unitPriceCents: l.unitPriceCents, amountCents: lineAmountCents(l) }))
  const vehicle = db.select({ id: tables.vehicles.id, description: tables.vehicles.description, registration: tables.vehicles.registration })
    .from(tables.vehicles).where(eq(tables.vehicles.id, quote.vehicleId)).get()!
  const customer = db.select({ id: tables.users.id, name: tables.users.name, email: tables.users.email }).from(tables.users).where(eq(tables.users.id, quote.customerId)).get()!
  const core = quote.coreId === null ? null : db.select({ id: tables.cores.id, name: tables.cores.name }).from(tables.cores).where(eq(tables.cores.id, quote.coreId)).get() ?? null
  const workshop = db.select({ name: tables.workshops.name }).from(tables.workshops).where(eq(tables.workshops.id, quote.workshopId)).get()!
  const payments = db.select({ amountCents: tables.payments.amountCents, currency: tables.payments.currency, status: tables.payments.status, createdAt: tables.payments.createdAt })
    .from(tables.payments).where(eq(tables.payments.quoteId, quote.id)).all()
  return { ...quote, lines, vehicle, customer, core, workshop, payments }
}

export type QuoteDetail = ReturnType<typeof quoteDetail>

// Replace a quote's lines and store the totals computed from them (inside the caller's transaction).
export function writeQuoteLines(tx: Tx, quoteId: number, lines: Array<{ description: string, quantity: number, unitPriceCents: number }>) {
  tx.delete(tables.quoteLines).where(eq(tables.quoteLines.quoteId, quoteId)).run()
  tx.insert(tables.quoteLines).values(lines.map((l, position) => ({ quoteId, position, description: l.description, quantity: l.quantity, unitPriceCents: l.unitPriceCents }))).run()
}

// Next number for the workshop and year, taken inside the insert's transaction: a failed insert
// rolls the counter back with it, and a deleted quote never gives its number to another.
export function takeQuoteNumber(tx: Tx, workshopId: number, year: number) {
  const row = tx.insert(tables.quoteNumbers).values({ workshopId, year, last: 1 })
    .onConflictDoUpdate({ target: [tables.quoteNumbers.workshopId, tables.quoteNumbers.year], set: { last: sql`${tables.quoteNumbers.last} + 1` } })
    .returning().get()
  return `Q-${year}-${String(row.last).padStart(4, '0')}`
}
