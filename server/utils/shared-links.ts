import { and, eq, gt, isNull, or } from 'drizzle-orm'
import { z } from 'zod'

export const tokenParams = z.object({ token: z.string().min(20).max(100) })

// A shared report opens with its token alone; revoked or expired links are simply not found.
export function findSharedLog(token: string) {
  const { shareLinks, logs, vehicles, workshops } = tables
  const row = useDb().select({ log: logs, vehicle: vehicles, workshopName: workshops.name })
    .from(shareLinks)
    .innerJoin(logs, eq(logs.id, shareLinks.logId))
    .innerJoin(vehicles, eq(vehicles.id, logs.vehicleId))
    .innerJoin(workshops, eq(workshops.id, shareLinks.workshopId))
    .where(and(
      eq(shareLinks.tokenHash, hashToken(token)),
      isNull(shareLinks.revokedAt),
      or(isNull(shareLinks.expiresAt), gt(shareLinks.expiresAt, new Date())),
    ))
    .get()
  if (!row) notFound('Shared report (the link may have been withdrawn or have expired)')
  return row
}
