import { and, eq, isNull } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  requireOwner(actor)
  const db = useDb()
  const where = and(eq(tables.invites.id, id), eq(tables.invites.workshopId, actor.workshopId), isNull(tables.invites.acceptedAt))
  if (!db.select({ id: tables.invites.id }).from(tables.invites).where(where).get()) notFound('Invitation')
  db.transaction((tx) => {
    tx.delete(tables.invites).where(where).run()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'revoked-invite', entity: 'invite', entityId: id })
  })
  setResponseStatus(event, 204)
  return null
})
