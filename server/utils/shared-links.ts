import { and, desc, eq, gt, isNull, or } from 'drizzle-orm'
import { z } from 'zod'
import type { Actor } from '#shared/utils/abilities'

const CUT_LINK = 'this shared link is not complete: copy the whole link from the e-mail or message'
export const tokenParams = z.object({ token: z.string().min(20, CUT_LINK).max(100, CUT_LINK) })

// One mechanism for every shared link: a log's report or a comparison. Exactly one target is set.
export type ShareTarget = { logId: number } | { comparisonId: number }

export const shareBody = z.object({
  expiresInDays: z.number().int().min(1, 'a link lasts 1 to 365 days').max(365, 'a link lasts 1 to 365 days').default(30),
  emailDriver: z.boolean().default(false),
}).strict()

const targetColumn = (target: ShareTarget) => ('logId' in target
  ? eq(tables.shareLinks.logId, target.logId)
  : eq(tables.shareLinks.comparisonId, target.comparisonId))

const stillWorks = () => and(isNull(tables.shareLinks.revokedAt), or(isNull(tables.shareLinks.expiresAt), gt(tables.shareLinks.expiresAt, new Date())))

/**
 * Create a link (and, if asked, e-mail it to the car's customer) in one transaction. `mail`
 * words the message for what is shared.
 */
export async function createShareLink(actor: Actor & { name: string }, target: ShareTarget, options: z.infer<typeof shareBody>, vehicle: { ownerId: number }, mail: (to: { name: string }, url: string, expiresAt: Date, workshopName: string) => { subject: string, text: string, kind: 'report-share' | 'comparison-share' }) {
  const { token, tokenHash } = newToken()
  const url = appLink(`/shared/${token}`)
  const expiresAt = new Date(Date.now() + options.expiresInDays * 86_400_000)
  const db = useDb()
  const driver = db.select().from(tables.users).where(eq(tables.users.id, vehicle.ownerId)).get()!
  const workshop = db.select({ name: tables.workshops.name }).from(tables.workshops).where(eq(tables.workshops.id, actor.workshopId)).get()!
  const entity = 'logId' in target ? { entity: 'log', entityId: target.logId } : { entity: 'comparison', entityId: target.comparisonId }
  const { link, mailId } = db.transaction((tx) => {
    const row = tx.insert(tables.shareLinks).values({ workshopId: actor.workshopId, ...target, tokenHash, createdById: actor.id, expiresAt }).returning().get()
    const mailId = options.emailDriver
      ? queueMail(tx, { workshopId: actor.workshopId, to: driver.email, ...mail(driver, url, expiresAt, workshop.name) }).id
      : null
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'shared', ...entity, detail: { shareLinkId: row.id, emailed: options.emailDriver ? driver.email : null } })
    return { link: row, mailId }
  })
  // Say whether the e-mail really went, not only that it was queued.
  const delivery = mailId === null ? null : await awaitFirstDelivery(mailId)
  return { id: link.id, url, expiresAt: link.expiresAt, emailedTo: options.emailDriver ? driver.email : null, mail: delivery }
}

export function shareLinksOf(target: ShareTarget) {
  const { shareLinks } = tables
  return useDb().select({ id: shareLinks.id, createdAt: shareLinks.createdAt, expiresAt: shareLinks.expiresAt, revokedAt: shareLinks.revokedAt })
    .from(shareLinks).where(targetColumn(target)).orderBy(desc(shareLinks.createdAt)).all()
}

/** The live link for a token, whatever it shares; withdrawn or expired links are simply not found. */
export function findShareLink(token: string) {
  const row = useDb().select().from(tables.shareLinks).where(and(eq(tables.shareLinks.tokenHash, hashToken(token)), stillWorks())).get()
  if (!row) notFound('Shared report (the link may have been withdrawn or have expired)')
  return row
}

// A shared report opens with its token alone; revoked or expired links are simply not found.
export function findSharedLog(token: string) {
  const { shareLinks, logs, vehicles, workshops } = tables
  const row = useDb().select({ log: logs, vehicle: vehicles, workshopName: workshops.name })
    .from(shareLinks)
    .innerJoin(logs, eq(logs.id, shareLinks.logId))
    .innerJoin(vehicles, eq(vehicles.id, logs.vehicleId))
    .innerJoin(workshops, eq(workshops.id, shareLinks.workshopId))
    .where(and(eq(shareLinks.tokenHash, hashToken(token)), stillWorks()))
    .get()
  if (!row) notFound('Shared report (the link may have been withdrawn or have expired)')
  return row
}

export function findSharedComparison(token: string) {
  const { shareLinks, comparisons, vehicles, workshops } = tables
  const row = useDb().select({ comparison: comparisons, vehicle: vehicles, workshopName: workshops.name })
    .from(shareLinks)
    .innerJoin(comparisons, eq(comparisons.id, shareLinks.comparisonId))
    .innerJoin(vehicles, eq(vehicles.id, comparisons.vehicleId))
    .innerJoin(workshops, eq(workshops.id, shareLinks.workshopId))
    .where(and(eq(shareLinks.tokenHash, hashToken(token)), stillWorks()))
    .get()
  if (!row) notFound('Shared comparison (the link may have been withdrawn or have expired)')
  return row
}
