import { and, eq, gt, isNull } from 'drizzle-orm'

export function findOpenInvite(token: string) {
  const { invites, workshops } = tables
  const row = useDb().select({ invite: invites, workshopName: workshops.name })
    .from(invites)
    .innerJoin(workshops, eq(workshops.id, invites.workshopId))
    .where(and(eq(invites.tokenHash, hashToken(token)), isNull(invites.acceptedAt), gt(invites.expiresAt, new Date())))
    .get()
  if (!row) throw createError({ statusCode: 404, message: 'This invitation has expired, was used already, or the link is cut short. Ask the workshop for a new one.' })
  return row
}
