import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const workshop = useDb().select().from(tables.workshops).where(eq(tables.workshops.id, actor.workshopId)).get()!
  return workshop
})
