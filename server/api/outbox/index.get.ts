import { and, asc, count, desc, eq, sql } from 'drizzle-orm'
import { z } from 'zod'
import { OUTBOX_SORT_KEYS } from '#shared/utils/outbox'

const query = z.object({
  status: z.enum(tables.OUTBOX_STATUSES, { message: `status is one of ${tables.OUTBOX_STATUSES.join(', ')}` }).optional(),
  page: z.coerce.number({ message: 'page is a whole number from 1' }).int('page is a whole number from 1').min(1, 'page is a whole number from 1').default(1),
  q: z.string().trim().max(80, 'keep the search under 80 characters').optional(),
  sort: z.enum(OUTBOX_SORT_KEYS, { message: `sort by one of: ${OUTBOX_SORT_KEYS.join(', ')}` }).default('queued'),
  dir: z.enum(['asc', 'desc'], { message: 'the order is asc or desc' }).default('desc'),
  limit: z.coerce.number({ message: 'show 1 to 100 e-mails a page' }).int('show 1 to 100 e-mails a page').min(1, 'show 1 to 100 e-mails a page').max(100, 'show 1 to 100 e-mails a page').default(25),
})

// Newest first unless sorted by a fixed key, a page at a time; the total goes in X-Total-Count so
// the page can say how many there are.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  requireOutboxReader(actor)
  const { status, q, sort, dir, page, limit } = readQueryWith(event, query)
  const { outbox } = tables
  // LIKE wildcards typed by the user are matched literally.
  const pattern = q ? `%${q.replace(/[\\%_]/g, c => `\\${c}`)}%` : null
  const where = and(
    visibleOutbox(actor),
    status ? eq(outbox.status, status) : undefined,
    pattern ? sql`(${outbox.toEmail} like ${pattern} escape '\\' or ${outbox.subject} like ${pattern} escape '\\')` : undefined,
  )
  // Fixed sort keys mapped to columns here: the client never names a column.
  const expressions = {
    queued: outbox.id,
    to: sql`${outbox.toEmail} collate nocase`,
    subject: sql`${outbox.subject} collate nocase`,
    kind: outbox.kind,
    status: outbox.status,
    attempts: outbox.attempts,
    sent: outbox.sentAt,
  } as const
  const order = dir === 'desc' ? desc : asc
  const db = useDb()
  const total = db.select({ n: count() }).from(outbox).where(where).get()?.n ?? 0
  const rows = db.select().from(outbox).where(where).orderBy(order(expressions[sort]), desc(outbox.id)).limit(limit).offset((page - 1) * limit).all()
  setResponseHeader(event, 'X-Total-Count', String(total))
  return rows.map(outboxEntry)
})
