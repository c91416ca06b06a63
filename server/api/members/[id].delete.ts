import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  requireOwner(actor)
  const member = findMember(actor, id)
  if (member.id === actor.id) badRequest('You cannot remove yourself. Make someone else owner, and ask them to remove you.')
  const db = useDb()
  const cars = countRows(tables.vehicles, eq(tables.vehicles.ownerId, id))
  if (cars > 0) badRequest(`This customer still has ${cars} car${cars === 1 ? '' : 's'}. Open each one under Cars and choose another customer for it (or delete it), then remove the customer.`)
  db.transaction((tx) => {
    tx.delete(tables.users).where(eq(tables.users.id, id)).run()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'removed-member', entity: 'user', entityId: id, detail: { email: member.email, role: member.role } })
  })
  setResponseStatus(event, 204)
  return null
})
