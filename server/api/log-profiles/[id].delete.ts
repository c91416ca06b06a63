import { and, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  if (!canManageLogProfiles(actor)) forbidden('Only a tuner or the workshop owner removes log profiles.')
  const where = and(eq(tables.logProfiles.id, id), eq(tables.logProfiles.workshopId, actor.workshopId))
  const db = useDb()
  if (!db.select({ id: tables.logProfiles.id }).from(tables.logProfiles).where(where).get()) notFound('Log profile')
  db.transaction((tx) => {
    tx.delete(tables.logProfiles).where(where).run()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'deleted', entity: 'log-profile', entityId: id })
  })
  setResponseStatus(event, 204)
  return null
})
