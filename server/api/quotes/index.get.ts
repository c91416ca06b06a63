import { and, asc, desc, eq, sql, type SQL } from 'drizzle-orm'
import { z } from 'zod'
import { QUOTE_PAGE_SIZES, QUOTE_SORT_KEYS, QUOTE_STATES } from '#shared/utils/quotes'

const query = z.object({
  vehicleId: z.coerce.number().int().positive().optional(),
  status: z.enum(QUOTE_STATES, { message: `status is one of ${QUOTE_STATES.join(', ')}` }).optional(),
  q: z.string().trim().max(80, 'keep the search under 80 characters').optional(),
  sort: z.enum(QUOTE_SORT_KEYS, { message: `sort by one of: ${QUOTE_SORT_KEYS.join(', ')}` }).default('number'),
  dir: z.enum(['asc', 'desc'], { message: 'the order is asc or desc' }).default('desc'),
  page: z.coerce.number({ message: 'pages start at 1' }).int('pages start at 1').min(1, 'pages start at 1').max(10_000, 'pages go up to 10 000').optional(),
  pageSize: z.coerce.number().int().refine(n => (QUOTE_PAGE_SIZES as readonly number[]).includes(n), `a page holds ${QUOTE_PAGE_SIZES.join(', ')} quotes`).default(25),
})

// Without `page`, every quote the actor may see as an array, newest first; with `page`, one page of
// the quote table (searched and sorted by a fixed key) with its total.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { vehicleId, status, q: text, sort, dir, page, pageSize } = readQueryWith(event, query)
  expireDueQuotes(actor)
  const { quotes: q, vehicles, users } = tables
  const where: Array<SQL | undefined> = [visibleQuotes(actor), vehicleId ? eq(q.vehicleId, vehicleId) : undefined, status ? eq(q.status, status) : undefined]
  if (text) {
    // LIKE wildcards typed by the user are matched literally.
    const pattern = `%${text.replace(/[\\%_]/g, c => `\\${c}`)}%`
    const like = (expression: SQL) => sql`${expression} like ${pattern} escape '\\'`
    where.push(sql`(${like(sql`${q.number}`)} or ${like(sql`${vehicles.description}`)} or ${like(sql`coalesce(${vehicles.registration}, '')`)} or ${like(sql`${users.name}`)})`)
  }
  // Fixed sort keys mapped to expressions here: the client never names a column.
  const expressions = {
    number: q.number,
    car: sql`${vehicles.description} collate nocase`,
    status: q.status,
    validUntil: q.validUntil,
    total: q.totalCents,
  } as const
  const order = dir === 'desc' ? desc : asc
  const filter = and(...where)
  const db = useDb()
  const list = () => db.select({
    id: q.id, number: q.number, status: q.status, revision: q.revision, currency: q.currency,
    totalCents: q.totalCents, depositCents: q.depositCents, validUntil: q.validUntil, sentAt: q.sentAt, paidAt: q.paidAt,
    createdAt: q.createdAt, updatedAt: q.updatedAt,
    vehicle: { id: vehicles.id, description: vehicles.description, registration: vehicles.registration },
    customer: { id: users.id, name: users.name },
  })
    .from(q)
    .innerJoin(vehicles, eq(vehicles.id, q.vehicleId))
    .innerJoin(users, eq(users.id, q.customerId))
    .where(filter)
    .orderBy(order(expressions[sort]), desc(q.id))

  if (page === undefined) return list().all()
  const total = db.select({ n: sql<number>`count(*)` }).from(q)
    .innerJoin(vehicles, eq(vehicles.id, q.vehicleId))
    .innerJoin(users, eq(users.id, q.customerId))
    .where(filter).get()?.n ?? 0
  const items = list().limit(pageSize).offset((page - 1) * pageSize).all()
  return { items, total, page, pageSize }
})
