import { and, eq } from 'drizzle-orm'
import type { Actor } from '#shared/utils/abilities'

export function requireOwner(actor: Actor) {
  if (!canManageMembers(actor)) forbidden('Only the workshop owner manages people and invitations.')
}

export function findMember(actor: Actor, id: number) {
  const member = useDb().select().from(tables.users).where(and(eq(tables.users.id, id), eq(tables.users.workshopId, actor.workshopId))).get()
  if (!member) notFound('Member')
  return member
}

export function ownerCount(workshopId: number) {
  return countRows(tables.users, and(eq(tables.users.workshopId, workshopId), eq(tables.users.role, 'owner')))
}
