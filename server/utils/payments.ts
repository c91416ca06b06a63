import { randomBytes } from 'node:crypto'
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http'
import Stripe from 'stripe'
import { formatMoney } from '#shared/utils/format'

// Deposits go through the official Stripe SDK and a hosted Checkout Session: the customer types
// their card on the payment service's page, never on ours, and we only hear back through a signed
// webhook. With no STRIPE_SECRET_KEY (the default) a small local stand-in for the few endpoints we
// use starts on loopback, and the SDK is pointed at it. Process-wide infrastructure (a port and a
// secret), never per-user state.

const FAKE_KEY = 'sk_test_local_stand_in'
let fakeStart: Promise<number> | undefined
let fakeServer: Server | undefined
let localWebhookSecret: string | undefined

export const usingLocalCheckout = () => !process.env.STRIPE_SECRET_KEY

export function stripeWebhookSecret(): string | null {
  if (process.env.STRIPE_WEBHOOK_SECRET) return process.env.STRIPE_WEBHOOK_SECRET
  if (!usingLocalCheckout()) return null
  localWebhookSecret ??= `whsec_local_${randomBytes(24).toString('hex')}`
  return localWebhookSecret
}

export async function useStripe(): Promise<Stripe> {
  if (!usingLocalCheckout()) return new Stripe(process.env.STRIPE_SECRET_KEY!, { maxNetworkRetries: 1 })
  const port = await startLocalCheckout()
  return new Stripe(FAKE_KEY, { host: '127.0.0.1', port, protocol: 'http', maxNetworkRetries: 0, telemetry: false })
}

// Verification needs no network: the SDK checks the HMAC and the timestamp.
export const webhookVerifier = () => new Stripe(process.env.STRIPE_SECRET_KEY || FAKE_KEY).webhooks

export function stopLocalCheckout() {
  fakeServer?.close()
  fakeServer = undefined
  fakeStart = undefined
}

// ---- the local stand-in -------------------------------------------------------------------------

interface LocalSession {
  id: string
  object: 'checkout.session'
  mode: string
  status: 'open' | 'complete'
  payment_status: 'unpaid' | 'paid'
  amount_total: number
  currency: string
  description: string
  success_url: string
  cancel_url: string | null
  metadata: Record<string, string>
  client_reference_id: string | null
  customer_email: string | null
  payment_intent: string | null
  url: string
  created: number
  livemode: false
}

const sessions = new Map<string, LocalSession>()

function startLocalCheckout(): Promise<number> {
  fakeStart ??= new Promise((resolve, reject) => {
    const server = createServer((req, res) => {
      handle(req, res).catch((error: unknown) => {
        console.error('Local checkout stand-in failed:', error)
        if (!res.headersSent) send(res, 500, 'text/plain; charset=utf-8', 'The local checkout could not complete this request.')
      })
    })
    server.once('error', reject)
    // Loopback only, on a free port; unref so it never keeps the process alive on shutdown.
    server.listen(0, '127.0.0.1', () => {
      const address = server.address()
      server.unref()
      fakeServer = server
      if (address && typeof address === 'object') resolve(address.port)
      else reject(new Error('no port for the local checkout'))
    })
  })
  return fakeStart
}

function send(res: ServerResponse, status: number, type: string, body: string, headers: Record<string, string> = {}) {
  res.writeHead(status, { 'content-type': type, ...headers })
  res.end(body)
}

async function readText(req: IncomingMessage) {
  const chunks: Buffer[] = []
  let size = 0
  for await (const chunk of req) {
    size += (chunk as Buffer).length
    if (size > 64_000) throw new Error('request too large')
    chunks.push(chunk as Buffer)
  }
  return Buffer.concat(chunks).toString('utf8')
}

function apiError(res: ServerResponse, status: number, message: string) {
  send(res, status, 'application/json', JSON.stringify({ error: { type: 'invalid_request_error', message } }))
}

async function handle(req: IncomingMessage, res: ServerResponse) {
  const url = new URL(req.url ?? '/', 'http://127.0.0.1')
  if (req.method === 'POST' && url.pathname === '/v1/checkout/sessions') return createSession(req, res)
  const match = /^\/pay\/(cs_local_[\w]+)$/.exec(url.pathname)
  const session = match ? sessions.get(match[1]!) : undefined
  if (!session) return send(res, 404, 'text/html; charset=utf-8', page('Not found', '<p>This checkout does not exist. Go back to the quote and start the payment again.</p>'))
  if (req.method === 'GET') return send(res, 200, 'text/html; charset=utf-8', checkoutPage(session))
  if (req.method === 'POST') return completeSession(session, res)
  send(res, 405, 'text/plain; charset=utf-8', 'Method not allowed')
}

async function createSession(req: IncomingMessage, res: ServerResponse) {
  if (req.headers.authorization !== `Bearer ${FAKE_KEY}`) return apiError(res, 401, 'Invalid API key.')
  const form = new URLSearchParams(await readText(req))
  const amount = Number(form.get('line_items[0][price_data][unit_amount]'))
  const currency = form.get('line_items[0][price_data][currency]')
  const successUrl = form.get('success_url')
  if (form.get('mode') !== 'payment' || !Number.isInteger(amount) || amount <= 0 || !currency || !successUrl) {
    return apiError(res, 400, 'The local checkout takes one priced line, a currency, mode=payment and a success_url.')
  }
  const metadata: Record<string, string> = {}
  for (const [key, value] of form) {
    const meta = /^metadata\[(\w+)\]$/.exec(key)
    if (meta) metadata[meta[1]!] = value
  }
  const id = `cs_local_${randomBytes(12).toString('hex')}`
  const port = (req.socket.localPort ?? 0)
  const session: LocalSession = {
    id,
    object: 'checkout.session',
    mode: 'payment',
    status: 'open',
    payment_status: 'unpaid',
    amount_total: amount * Number(form.get('line_items[0][quantity]') ?? 1),
    currency,
    description: form.get('line_items[0][price_data][product_data][name]') ?? 'Payment',
    success_url: successUrl,
    cancel_url: form.get('cancel_url'),
    metadata,
    client_reference_id: form.get('client_reference_id'),
    customer_email: form.get('customer_email'),
    payment_intent: null,
    url: `http://127.0.0.1:${port}/pay/${id}`,
    created: Math.floor(Date.now() / 1000),
    livemode: false,
  }
  // A practice stand-in, not a store: keep the newest sessions only, so memory stays bounded.
  if (sessions.size >= 500) sessions.delete(sessions.keys().next().value!)
  sessions.set(id, session)
  send(res, 200, 'application/json', JSON.stringify(session))
}

// The form posted back: mark the session paid, tell the app through a signed webhook exactly as the
// real service would, then send the customer to the success address.
async function completeSession(session: LocalSession, res: ServerResponse) {
  if (session.status === 'open') {
    session.status = 'complete'
    session.payment_status = 'paid'
    session.payment_intent = `pi_local_${randomBytes(12).toString('hex')}`
    const event = {
      id: `evt_local_${randomBytes(12).toString('hex')}`,
      object: 'event',
      type: 'checkout.session.completed',
      api_version: Stripe.API_VERSION,
      created: Math.floor(Date.now() / 1000),
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
      data: { object: { ...session } },
    }
    const payload = JSON.stringify(event)
    const signature = webhookVerifier().generateTestHeaderString({ payload, secret: stripeWebhookSecret()! })
    const reply = await fetch(appLink('/api/webhooks/stripe'), { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': signature }, body: payload })
      .catch(() => null)
    if (!reply?.ok) {
      session.status = 'open'
      session.payment_status = 'unpaid'
      session.payment_intent = null
      return send(res, 502, 'text/html; charset=utf-8', page('Not confirmed', '<p>The workshop\'s system did not confirm the payment, so nothing was taken. Try again in a minute.</p>'))
    }
  }
  send(res, 303, 'text/plain; charset=utf-8', 'Paid', { location: session.success_url.replace('{CHECKOUT_SESSION_ID}', session.id) })
}

const escapeHtml = (text: string) => text.replace(/[&<>"']/g, ch => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[ch]!)

function page(title: string, body: string) {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)} · Practice checkout</title>
<style>
body{margin:0;padding:0 1rem;font-family:system-ui,sans-serif;background:#eef1ec;color:#1d2430}
main{max-width:26rem;margin:2rem auto;padding:1.5rem;background:#fff;border:1px solid #cfd6cc;border-radius:12px}
h1{font-size:1.25rem;margin:0 0 .25rem}.amount{font-size:2rem;font-weight:600;margin:.75rem 0}
.note{background:#fff6dc;border:1px solid #e7d08a;border-radius:8px;padding:.6rem .8rem;font-size:.9rem}
button{width:100%;min-height:3rem;margin-top:1rem;border:0;border-radius:8px;background:#2f6b3f;color:#fff;font-size:1rem;font-weight:600;cursor:pointer}
a{color:#2f5d8b}.muted{color:#5b6474;font-size:.9rem}
</style></head><body><main>${body}</main></body></html>`
}

function checkoutPage(session: LocalSession) {
  const amount = formatMoney(session.amount_total, session.currency.toUpperCase())
  if (session.status === 'complete') {
    return page('Already paid', `<h1>Already paid</h1><p>${escapeHtml(session.description)} was paid.</p><p><a href="${escapeHtml(session.success_url)}">Back to the quote</a></p>`)
  }
  return page('Pay the deposit', `
<p class="muted">Practice checkout</p>
<h1>${escapeHtml(session.description)}</h1>
<p class="amount" data-testid="checkout-amount">${escapeHtml(amount)}</p>
<p class="note">This is the local practice checkout that stands in for the payment service while no payment account is set up. No card is asked for and no money moves.</p>
<form method="post" action="/pay/${session.id}"><button type="submit">Pay ${escapeHtml(amount)}</button></form>
${session.cancel_url ? `<p><a href="${escapeHtml(session.cancel_url)}">Go back without paying</a></p>` : ''}`)
}
