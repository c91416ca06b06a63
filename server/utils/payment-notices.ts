import { and, eq, inArray } from 'drizzle-orm'
import type Stripe from 'stripe'
import { QUOTE_MAKER_ROLES } from '#shared/utils/abilities'
import { formatMoney } from '#shared/utils/format'
import { canMoveQuote, QUOTE_STATE_LABELS } from '#shared/utils/quotes'

// A verified notice from the payment service. Each event id is handled once (payment_events), in
// the same transaction as its effects, so a replayed notice changes nothing.
export function recordPaymentNotice(notice: Stripe.Event) {
  return useDb().transaction((tx) => {
    const fresh = tx.insert(tables.paymentEvents).values({ id: notice.id, type: notice.type }).onConflictDoNothing().returning().get()
    if (!fresh) return { received: true, duplicate: true }
    if (notice.type !== 'checkout.session.completed') return { received: true, ignored: notice.type }
    const session = notice.data.object
    const quoteId = Number(session.metadata?.quoteId)
    const workshopId = Number(session.metadata?.workshopId)
    const quote = tx.select().from(tables.quotes).where(and(eq(tables.quotes.id, quoteId), eq(tables.quotes.workshopId, workshopId))).get()
    if (!quote || session.payment_status !== 'paid' || session.amount_total == null) return { received: true, ignored: 'no paid quote in this notice' }

    const providerRef = typeof session.payment_intent === 'string' ? session.payment_intent : session.id
    tx.insert(tables.payments).values({
      workshopId: quote.workshopId,
      quoteId: quote.id,
      provider: 'stripe',
      providerRef,
      amountCents: session.amount_total,
      currency: (session.currency ?? quote.currency).toUpperCase(),
      status: 'succeeded',
    }).onConflictDoNothing().run()
    const detail = { eventId: notice.id, providerRef, amountCents: session.amount_total }
    // The customer paid; the audit names them. Money for a quote that can no longer be paid (it was
    // cancelled meanwhile) is recorded and flagged for the workshop to settle, not silently dropped.
    const payable = canMoveQuote(quote.status, 'pay')
    if (payable) moveQuote(tx, quote, 'pay', quote.customerId, { paidAt: new Date() }, detail)
    else recordAudit(tx, { workshopId: quote.workshopId, userId: quote.customerId, action: 'payment-on-closed-quote', entity: 'quote', entityId: quote.id, detail: { ...detail, status: quote.status } })

    const staff = tx.select({ email: tables.users.email, name: tables.users.name }).from(tables.users)
      .where(and(eq(tables.users.workshopId, quote.workshopId), inArray(tables.users.role, [...QUOTE_MAKER_ROLES]))).all()
    const vehicle = tx.select({ description: tables.vehicles.description }).from(tables.vehicles).where(eq(tables.vehicles.id, quote.vehicleId)).get()
    const amount = formatMoney(session.amount_total, quote.currency)
    const state = QUOTE_STATE_LABELS[quote.status].toLowerCase()
    for (const person of staff) {
      queueMail(tx, {
        workshopId: quote.workshopId,
        to: person.email,
        kind: 'payment',
        subject: payable ? `Deposit paid on quote ${quote.number}` : `Payment received on quote ${quote.number}, which is ${state}: settle it`,
        text: [
          `Hello ${person.name},`,
          '',
          payable
            ? `The customer paid the deposit of ${amount} on quote ${quote.number} (${vehicle?.description ?? 'their car'}). The work can be booked in.`
            : `A payment of ${amount} arrived for quote ${quote.number}, which is ${state}, so it was not recorded as a deposit. Densitas does not refund: settle it with the customer yourselves (refund it through your payment service, or agree a new quote).`,
          '',
          appLink(`/quotes/${quote.id}`),
        ].join('\n'),
      })
    }
    return { received: true, quoteId: quote.id, status: payable ? 'deposit_paid' : quote.status }
  })
}
