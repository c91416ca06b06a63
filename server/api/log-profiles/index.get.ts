import { asc, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { logProfiles } = tables
  return useDb().select({ id: logProfiles.id, name: logProfiles.name, headerSignature: logProfiles.headerSignature, mapping: logProfiles.mapping, createdAt: logProfiles.createdAt })
    .from(logProfiles).where(eq(logProfiles.workshopId, actor.workshopId)).orderBy(asc(logProfiles.name)).all()
})
