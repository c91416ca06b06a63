import { eq } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({ role: z.enum(ROLES, { message: `choose a role: ${ROLES.map(role => ROLE_LABELS[role].toLowerCase()).join(', ')}` }) }).strict()

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  requireOwner(actor)
  const member = findMember(actor, id)
  const { role } = await readBodyWith(event, body)
  if (isWorkshopOwner(member) && !isWorkshopOwner({ role }) && ownerCount(actor.workshopId) <= 1) {
    badRequest('A workshop needs at least one owner. Make someone else owner first.')
  }
  return useDb().transaction((tx) => {
    const row = tx.update(tables.users).set({ role }).where(eq(tables.users.id, id)).returning({ id: tables.users.id, name: tables.users.name, email: tables.users.email, role: tables.users.role }).get()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'changed-role', entity: 'user', entityId: id, detail: { from: member.role, to: role } })
    return row
  })
})
