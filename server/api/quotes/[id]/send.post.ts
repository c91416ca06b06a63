import { eq } from 'drizzle-orm'
import { formatDate, formatMoney } from '#shared/utils/format'
import { todayUtc } from '#shared/utils/quotes'

// Send the quote to the car's customer: the e-mail with the PDF attached goes into the outbox in
// the same transaction as the move, so a quote is never "sent" without its e-mail, or the reverse.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const quote = findVisibleQuote(actor, id)
  requireQuoteWriter(actor)
  assertMove(quote, 'send')
  if (quote.validUntil && quote.validUntil < todayUtc()) quoteConflict('The valid-until date of this quote has passed. Set a later date, then send it.')
  if (quote.totalCents <= 0) quoteConflict('This quote totals nothing. Add priced lines, then send it.')
  const db = useDb()
  const customer = db.select().from(tables.users).where(eq(tables.users.id, quote.customerId)).get()!
  const vehicle = db.select().from(tables.vehicles).where(eq(tables.vehicles.id, quote.vehicleId)).get()!
  const workshop = db.select().from(tables.workshops).where(eq(tables.workshops.id, quote.workshopId)).get()!
  const sentAt = new Date()
  const { bytes, filename } = await quotePdfFor({ ...quote, sentAt })
  const money = (cents: number) => formatMoney(cents, quote.currency)
  const { row, mailId } = db.transaction((tx) => {
    const moved = moveQuote(tx, quote, 'send', actor.id, { sentAt }, { to: customer.email })
    const mail = queueMail(tx, {
      workshopId: quote.workshopId,
      to: customer.email,
      subject: `Quote ${quote.number} from ${workshop.name}`,
      kind: 'quote',
      text: [
        `Hello ${customer.name},`,
        '',
        `${workshop.name} has quoted the work on your ${vehicle.description}${vehicle.registration ? ` (${vehicle.registration})` : ''}: quote ${quote.number}${quote.revision > 1 ? `, revision ${quote.revision}` : ''}, attached as a PDF.`,
        '',
        `Total: ${money(quote.totalCents)} including tax. Deposit to book the work: ${money(quote.depositCents)}.`,
        quote.validUntil ? `The quote is valid until ${formatDate(quote.validUntil)}.` : '',
        '',
        `Sign in to Densitas to accept or decline it, and to pay the deposit: ${appLink(`/quotes/${quote.id}`)}`,
        '',
        `Questions? Ask ${workshop.name}.`,
      ].join('\n'),
      attachments: [{ filename, contentType: 'application/pdf', content: bytes }],
    })
    return { row: moved, mailId: mail.id }
  })
  // Say whether the e-mail really went, not only that it was queued.
  const mail = await awaitFirstDelivery(mailId)
  return { ...quoteDetail(row), mail }
})
