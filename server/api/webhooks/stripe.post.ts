import type Stripe from 'stripe'

// Signed notices from the payment service. No session: the signature (HMAC of the raw body with
// the webhook secret, checked by the SDK) is the authentication, so the raw bytes are read as sent.
export default defineEventHandler(async (event) => {
  const secret = stripeWebhookSecret()
  if (!secret) throw createError({ statusCode: 503, message: 'Payment notices are not set up: STRIPE_WEBHOOK_SECRET is missing.' })
  const payload = await readRawBody(event, 'utf8')
  const signature = getHeader(event, 'stripe-signature')
  if (!payload || !signature) badRequest('Unsigned payment notice: refused.')
  let notice: Stripe.Event
  try {
    notice = webhookVerifier().constructEvent(payload, signature, secret)
  }
  catch {
    badRequest('The payment notice\'s signature does not match: refused.')
  }
  return recordPaymentNotice(notice)
})
