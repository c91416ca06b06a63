import { and, asc, desc, eq, isNotNull, isNull, sql, type SQL } from 'drizzle-orm'

// Without `page`, the whole list of active cores as an array (the car form's core picker and other
// pickers); with `page`, one page of the catalogue table with its total.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canViewCores(actor)) forbidden('The core catalogue is for the workshop\'s staff.')
  const query = readQueryWith(event, coreListQuery)
  const { cores } = tables

  const where: SQL[] = [eq(cores.workshopId, actor.workshopId)]
  if (query.status === 'active') where.push(isNull(cores.retiredAt))
  if (query.status === 'retired') where.push(isNotNull(cores.retiredAt))
  if (query.q) {
    // LIKE wildcards typed by the user are matched literally.
    const pattern = `%${query.q.replace(/[\\%_]/g, c => `\\${c}`)}%`
    where.push(sql`(${cores.name} like ${pattern} escape '\\' or ${cores.notes} like ${pattern} escape '\\')`)
  }
  // Fixed sort keys mapped to expressions here: the client never names a column.
  const expressions = {
    name: sql`${cores.name} collate nocase`,
    kind: cores.kind,
    faceArea: sql`${cores.faceWidthMm} * ${cores.faceHeightMm}`,
    depth: cores.depthMm,
    price: cores.priceCents,
    updated: sql`coalesce(${cores.updatedAt}, ${cores.createdAt})`,
  } as const
  const order = query.dir === 'desc' ? desc : asc
  const orderBy = [order(expressions[query.sort]), asc(cores.id)]
  const filter = and(...where)

  const db = useDb()
  if (query.page === undefined) {
    return db.select().from(cores).where(filter).orderBy(...orderBy).all().map(coreView)
  }
  const total = db.select({ n: sql<number>`count(*)` }).from(cores).where(filter).get()?.n ?? 0
  const items = db.select().from(cores).where(filter).orderBy(...orderBy)
    .limit(query.pageSize).offset((query.page - 1) * query.pageSize).all().map(coreView)
  return { items, total, page: query.page, pageSize: query.pageSize }
})
