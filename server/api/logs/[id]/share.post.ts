import { eq } from 'drizzle-orm'
import { z } from 'zod'

const body = z.object({
  expiresInDays: z.number().int().min(1, 'a link lasts 1 to 365 days').max(365, 'a link lasts 1 to 365 days').default(30),
  emailDriver: z.boolean().default(false),
}).strict()

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { log, vehicle } = findVisibleLog(actor, id)
  if (!canShareReport(actor)) forbidden('Only a tuner or the workshop owner can share a report by link.')
  const { expiresInDays, emailDriver } = await readBodyWith(event, body)
  const { token, tokenHash } = newToken()
  const url = appLink(`/shared/${token}`)
  const expiresAt = new Date(Date.now() + expiresInDays * 86_400_000)
  const db = useDb()
  const driver = db.select().from(tables.users).where(eq(tables.users.id, vehicle.ownerId)).get()!
  const workshop = db.select({ name: tables.workshops.name }).from(tables.workshops).where(eq(tables.workshops.id, actor.workshopId)).get()!
  const { link, mailId } = db.transaction((tx) => {
    const row = tx.insert(tables.shareLinks).values({ workshopId: actor.workshopId, logId: log.id, tokenHash, createdById: actor.id, expiresAt }).returning().get()
    let mailId: number | null = null
    if (emailDriver) {
      mailId = queueMail(tx, {
        workshopId: actor.workshopId,
        to: driver.email,
        subject: `Your heat-soak report from ${workshop.name}`,
        kind: 'report-share',
        text: `Hello ${driver.name},\n\n${actor.name} of ${workshop.name} has shared the report on the log of your ${vehicle.description}. Open it here (no sign-in needed) until ${expiresAt.toDateString()}:\n\n${url}\n\nReply to the workshop with any questions.`,
      }).id
    }
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'shared', entity: 'log', entityId: log.id, detail: { shareLinkId: row.id, emailed: emailDriver ? driver.email : null } })
    return { link: row, mailId }
  })
  // Say whether the e-mail really went, not only that it was queued.
  const mail = mailId === null ? null : await awaitFirstDelivery(mailId)
  setResponseStatus(event, 201)
  return { id: link.id, url, expiresAt: link.expiresAt, emailedTo: emailDriver ? driver.email : null, mail }
})
