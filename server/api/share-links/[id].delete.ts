import { and, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  if (!canShareReport(actor)) forbidden('Only a tuner or the workshop owner manages shared links.')
  const db = useDb()
  const where = and(eq(tables.shareLinks.id, id), eq(tables.shareLinks.workshopId, actor.workshopId))
  const link = db.select().from(tables.shareLinks).where(where).get()
  if (!link) notFound('Shared link')
  db.transaction((tx) => {
    tx.update(tables.shareLinks).set({ revokedAt: new Date() }).where(where).run()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'revoked-share', entity: link.comparisonId ? 'comparison' : 'log', entityId: link.comparisonId ?? link.logId, detail: { shareLinkId: id } })
  })
  setResponseStatus(event, 204)
  return null
})
