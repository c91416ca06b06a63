import { asc, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canViewCores(actor)) forbidden('The core catalogue is for the workshop\'s staff.')
  return useDb().select().from(tables.cores).where(eq(tables.cores.workshopId, actor.workshopId)).orderBy(asc(tables.cores.name)).all()
})
