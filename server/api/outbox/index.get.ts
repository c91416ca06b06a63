import { and, count, desc, eq } from 'drizzle-orm'
import { z } from 'zod'

const query = z.object({
  status: z.enum(tables.OUTBOX_STATUSES, { message: `status is one of ${tables.OUTBOX_STATUSES.join(', ')}` }).optional(),
  page: z.coerce.number({ message: 'page is a whole number from 1' }).int('page is a whole number from 1').min(1, 'page is a whole number from 1').default(1),
  limit: z.coerce.number({ message: 'show 1 to 100 e-mails a page' }).int('show 1 to 100 e-mails a page').min(1, 'show 1 to 100 e-mails a page').max(100, 'show 1 to 100 e-mails a page').default(25),
})

// Newest first, a page at a time; the total goes in X-Total-Count so the page can offer older ones.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  requireOutboxReader(actor)
  const { status, page, limit } = readQueryWith(event, query)
  const where = and(visibleOutbox(actor), status ? eq(tables.outbox.status, status) : undefined)
  const db = useDb()
  const total = db.select({ n: count() }).from(tables.outbox).where(where).get()?.n ?? 0
  const rows = db.select().from(tables.outbox).where(where).orderBy(desc(tables.outbox.id)).limit(limit).offset((page - 1) * limit).all()
  setResponseHeader(event, 'X-Total-Count', String(total))
  return rows.map(outboxEntry)
})
