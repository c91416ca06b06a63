import { desc, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { log } = findVisibleLog(actor, id)
  if (!canShareReport(actor)) forbidden('Only a tuner or the workshop owner manages shared links.')
  const { shareLinks } = tables
  return useDb().select({ id: shareLinks.id, createdAt: shareLinks.createdAt, expiresAt: shareLinks.expiresAt, revokedAt: shareLinks.revokedAt })
    .from(shareLinks).where(eq(shareLinks.logId, log.id)).orderBy(desc(shareLinks.createdAt)).all()
})
