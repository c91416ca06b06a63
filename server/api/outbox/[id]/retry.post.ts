import { and, eq } from 'drizzle-orm'

// "Try again" on a failed e-mail: a fresh set of tries, the first one at once; the reply says
// what that first try did.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  requireOutboxReader(actor)
  const { id } = readParamsWith(event, idParams)
  const db = useDb()
  const row = db.select().from(tables.outbox).where(and(eq(tables.outbox.id, id), visibleOutbox(actor))).get()
  if (!row) notFound('E-mail')
  const moved = db.transaction((tx) => {
    if (!requeueFailedMail(tx, id)) return false
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'retried-email', entity: 'outbox', entityId: id, detail: { to: row.toEmail, previousError: row.error } })
    return true
  })
  if (!moved) {
    throw createError({ statusCode: 409, message: row.status === 'sent' ? 'This e-mail was already sent; there is nothing to try again.' : 'This e-mail is still queued and will be tried again on its own. Wait for it to be sent or to fail.' })
  }
  deliverSoon()
  const delivery = await awaitFirstDelivery(id)
  const updated = db.select().from(tables.outbox).where(eq(tables.outbox.id, id)).get()!
  return { ...outboxEntry(updated), delivery }
})
