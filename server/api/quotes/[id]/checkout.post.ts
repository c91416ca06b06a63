import { eq } from 'drizzle-orm'

// The customer pays the deposit on the payment service's own page (a Checkout Session); we only
// hand back its address. The quote moves to "deposit paid" when the signed webhook arrives.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const quote = findVisibleQuote(actor, id)
  requireQuoteCustomer(actor, quote)
  assertMove(quote, 'pay')
  if (quote.depositCents <= 0) quoteConflict('No deposit is asked on this quote: the workshop will be in touch to book the work.')
  const vehicle = useDb().select({ description: tables.vehicles.description }).from(tables.vehicles).where(eq(tables.vehicles.id, quote.vehicleId)).get()!
  let url: string | null
  try {
    const stripe = await useStripe()
    const session = await stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: [{
        quantity: 1,
        price_data: {
          currency: quote.currency.toLowerCase(),
          unit_amount: quote.depositCents,
          product_data: { name: `Deposit for quote ${quote.number}`, description: vehicle.description },
        },
      }],
      customer_email: actor.email,
      client_reference_id: String(quote.id),
      metadata: { quoteId: String(quote.id), workshopId: String(quote.workshopId), revision: String(quote.revision) },
      success_url: appLink(`/quotes/${quote.id}?payment=done`),
      cancel_url: appLink(`/quotes/${quote.id}?payment=cancelled`),
    })
    url = session.url
  }
  catch (error) {
    console.error('Checkout session failed:', error)
    throw createError({ statusCode: 502, message: 'The payment service did not answer. Nothing was charged; try again in a minute.' })
  }
  if (!url) throw createError({ statusCode: 502, message: 'The payment service gave no checkout page. Nothing was charged; try again in a minute.' })
  useDb().transaction((tx) => {
    recordAudit(tx, { workshopId: quote.workshopId, userId: actor.id, action: 'checkout-started', entity: 'quote', entityId: quote.id, detail: { depositCents: quote.depositCents } })
  })
  return { url }
})
