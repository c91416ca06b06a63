import Database from 'better-sqlite3'
import Stripe from 'stripe'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { formatMoney } from '../../shared/utils/format'
import { quoteTotals, todayUtc } from '../../shared/utils/quotes'
import { Client, readDatabase, signIn, useTestServer } from './client'
import { pdfText } from './pdf'

await useTestServer()

// Quotes, their PDF and e-mail, and the deposit through the Stripe SDK against the local stand-in.

type Who = 'anonymous' | 'owner' | 'tuner' | 'fabricator' | 'driver' | 'driver2' | 'foreignOwner' | 'foreignDriver'
const EMAILS: Record<Exclude<Who, 'anonymous'>, string> = {
  owner: 'owner@kestrel.test',
  tuner: 'tuner@kestrel.test',
  fabricator: 'fab@kestrel.test',
  driver: 'driver@kestrel.test',
  driver2: 'driver2@kestrel.test',
  foreignOwner: 'owner@harbourside.test',
  foreignDriver: 'driver@harbourside.test',
}
const clients = {} as Record<Who, Client>
const ids = { driverCar: 0, driver2Car: 0, foreignCar: 0, frontMount: 0, foreignCore: 0 }
// Test servers get this secret (tests/setup/server.ts), so a test can sign notices like the service.
const WEBHOOK_SECRET = 'whsec_test_only_densitas_0123456789'
const stripe = new Stripe('sk_test_unused')

const LINES = [
  { description: 'Core: bar-and-plate front-mount', quantity: 1, unitPriceCents: 64_000 },
  { description: 'Charge pipework, per metre', quantity: 2.4, unitPriceCents: 3_250 },
  { description: 'Labour, hours', quantity: 6.5, unitPriceCents: 8_500 },
]

interface Created { id: number, number: string, status: string, totalCents: number, depositCents: number }
interface Detail extends Created { revision: number, subtotalCents: number, taxCents: number, taxRatePct: number, depositPct: number, validUntil: string, terms: string, paidAt: string | null, lines: Array<{ description: string, quantity: number, unitPriceCents: number, amountCents: number }> }

const one = <T>(sql: string, ...args: unknown[]) => readDatabase(db => db.prepare(sql).get(...args) as T)
const count = (sql: string, ...args: unknown[]) => one<{ n: number }>(sql, ...args).n

// Arrange a state the clock would reach later (a quote past its date): write the row directly.
function writeDatabase(sql: string, ...args: unknown[]) {
  const db = new Database(`${inject('dataDir')}/densitas.sqlite`)
  try {
    db.pragma('busy_timeout = 5000')
    db.prepare(sql).run(...args)
  }
  finally {
    db.close()
  }
}

function footprint() {
  return {
    quotes: count('select count(*) n from quotes'),
    lines: count('select count(*) n from quote_lines'),
    numbers: count('select coalesce(sum(last), 0) n from quote_numbers'),
    outbox: count('select count(*) n from outbox'),
    payments: count('select count(*) n from payments'),
    events: count('select count(*) n from payment_events'),
    audit: count('select count(*) n from audit_events'),
  }
}

async function create(by: Client = clients.fabricator, body: Record<string, unknown> = {}) {
  const reply = await by.post<Created>('/api/quotes', { vehicleId: ids.driverCar, coreId: ids.frontMount, lines: LINES, taxRatePct: 20, ...body })
  expect(reply.status, JSON.stringify(reply.body)).toBe(201)
  return reply.body
}

async function sent() {
  const quote = await create()
  expect((await clients.fabricator.post(`/api/quotes/${quote.id}/send`)).status).toBe(200)
  return quote
}

async function accepted() {
  const quote = await sent()
  expect((await clients.driver.post(`/api/quotes/${quote.id}/accept`)).status).toBe(200)
  return quote
}

async function rawGet(client: Client, path: string) {
  return fetch(`${inject('baseUrl')}${path}`, { headers: { 'cookie': client.cookie, 'x-forwarded-for': client.address } })
}

function signedNotice(quote: { id: number, depositCents: number }, overrides: Record<string, unknown> = {}) {
  const event = {
    id: `evt_test_${Math.random().toString(36).slice(2)}`,
    object: 'event',
    type: 'checkout.session.completed',
    created: Math.floor(Date.now() / 1000),
    data: {
      object: {
        id: `cs_test_${Math.random().toString(36).slice(2)}`,
        object: 'checkout.session',
        payment_status: 'paid',
        amount_total: quote.depositCents,
        currency: 'eur',
        payment_intent: `pi_test_${Math.random().toString(36).slice(2)}`,
        metadata: { quoteId: String(quote.id), workshopId: String(one<{ workshop_id: number }>('select workshop_id from quotes where id = ?', quote.id).workshop_id) },
        ...overrides,
      },
    },
  }
  const payload = JSON.stringify(event)
  return { payload, signature: stripe.webhooks.generateTestHeaderString({ payload, secret: WEBHOOK_SECRET }) }
}

function postNotice(payload: string, signature?: string) {
  return fetch(`${inject('baseUrl')}/api/webhooks/stripe`, { method: 'POST', headers: { 'content-type': 'application/json', ...(signature ? { 'stripe-signature': signature } : {}) }, body: payload })
}

beforeAll(async () => {
  clients.anonymous = new Client()
  for (const who of Object.keys(EMAILS) as Array<Exclude<Who, 'anonymous'>>) clients[who] = await signIn(EMAILS[who])
  const carOf = (email: string) => one<{ id: number }>('select v.id from vehicles v join users u on u.id = v.owner_id where u.email = ? order by v.id limit 1', email).id
  ids.driverCar = carOf(EMAILS.driver)
  ids.driver2Car = carOf(EMAILS.driver2)
  ids.foreignCar = carOf(EMAILS.foreignDriver)
  ids.frontMount = one<{ id: number }>('select id from cores where name = ?', 'Kestrel bar-and-plate front-mount 600').id
  ids.foreignCore = one<{ id: number }>('select c.id from cores c join workshops w on w.id = c.workshop_id where w.slug = ?', 'harbourside').id
})

describe('the demo quote', () => {
  it('is a sent quote for the hatchback with its e-mail and PDF in the outbox', async () => {
    const list = await clients.driver.get<Array<{ number: string, status: string }>>(`/api/quotes?vehicleId=${ids.driverCar}`)
    expect(list.body.some(q => q.status === 'sent')).toBe(true)
    const mail = one<{ attachments: string }>('select attachments from outbox where kind = \'quote\' and to_email = ? order by id limit 1', EMAILS.driver)
    expect(JSON.parse(mail.attachments)[0]).toMatchObject({ contentType: 'application/pdf' })
  })
})

describe('POST /api/quotes', () => {
  it('creates a draft with a workshop number, integer totals and the workshop\'s deposit share', async () => {
    const quote = await create()
    const expected = quoteTotals(LINES, 20, 30)
    expect(quote).toMatchObject({ status: 'draft', totalCents: expected.totalCents, depositCents: expected.depositCents })
    expect(quote.number).toMatch(new RegExp(`^Q-${todayUtc().slice(0, 4)}-\\d{4}$`))
    const detail = await clients.fabricator.get<Detail>(`/api/quotes/${quote.id}`)
    expect(detail.body).toMatchObject({ subtotalCents: expected.subtotalCents, taxCents: expected.taxCents, depositPct: 30, revision: 1 })
    expect(detail.body.lines.map(l => l.amountCents)).toEqual(expected.lineAmountsCents)
    expect(readDatabase(db => db.prepare('select user_id, action from audit_events where entity = \'quote\' and entity_id = ?').all(quote.id))).toEqual([
      { user_id: one<{ id: number }>('select id from users where email = ?', EMAILS.fabricator).id, action: 'created' },
    ])
  })

  it('numbers quotes one after the other; a refused quote takes no number', async () => {
    const first = await create()
    const refused = await clients.fabricator.post<{ message: string }>('/api/quotes', { vehicleId: ids.driverCar, lines: [] })
    expect(refused.status).toBe(400)
    expect(refused.body.message).toBe('The quote is not valid — lines: a quote needs at least one line. Correct it and try again.')
    const second = await create(clients.owner)
    const n = (q: Created) => Number(q.number.slice(-4))
    expect(n(second)).toBe(n(first) + 1)
  })

  it.each([
    ['anonymous', 401], ['tuner', 403], ['driver', 403], ['owner', 201], ['fabricator', 201],
  ] as const)('%s → %i', async (who, status) => {
    const reply = await clients[who].post('/api/quotes', { vehicleId: ids.driverCar, lines: LINES, taxRatePct: 20 })
    expect(reply.status).toBe(status)
  })

  const bad: Array<[string, Record<string, unknown>, RegExp]> = [
    ['a negative quantity', { lines: [{ ...LINES[0], quantity: -1 }] }, /line 1, quantity: a quantity is above 0/],
    ['fractions of a cent', { lines: [{ ...LINES[0], unitPriceCents: 100.5 }] }, /line 1, unit price: prices are in whole cents/],
    ['a quantity with three decimals', { lines: [{ ...LINES[0], quantity: 1.125 }] }, /at most two decimals/],
    ['no lines', { lines: [] }, /at least one line/],
    ['missing lines', { lines: undefined }, /lines/],
    ['a line without a description', { lines: [{ ...LINES[0], description: ' ' }] }, /describe the line/],
    ['a tax rate over 100 %', { taxRatePct: 120 }, /tax rate is 0–100 %/],
    ['a deposit share below 0', { depositPct: -5 }, /deposit share is 0–100 %/],
    ['a date in the past', { validUntil: '2020-01-01' }, /in the past/],
    ['a date that does not exist', { validUntil: '2027-02-30' }, /does not exist/],
    ['another workshop\'s car', { vehicleId: 0 }, /car/],
    ['another workshop\'s core', { coreId: -1 }, /core/],
    ['a sizing that is not this car\'s', { sizingId: 987_654 }, /no such sizing for this car/],
    ['an unknown field', { discount: 10 }, /discount/],
  ]
  it.each(bad)('refuses %s with a message and stores nothing', async (_what, change, message) => {
    const before = footprint()
    const body: Record<string, unknown> = { vehicleId: ids.driverCar, lines: LINES, taxRatePct: 20, ...change }
    if (body.vehicleId === 0) body.vehicleId = ids.foreignCar
    if (body.coreId === -1) body.coreId = ids.foreignCore
    const reply = await clients.fabricator.post<{ message: string }>('/api/quotes', body)
    expect(reply.status).toBe(400)
    expect(reply.body.message).toMatch(message)
    expect(reply.body.message).not.toMatch(/unitPriceCents|vehicleId|coreId|sizingId|taxRatePct/)
    expect(footprint()).toEqual(before)
  })

  it('answers the car and core of another workshop without saying whether they exist', async () => {
    const car = await clients.foreignOwner.post<{ message: string }>('/api/quotes', { vehicleId: ids.driverCar, lines: LINES, taxRatePct: 20 })
    expect(car.status).toBe(400)
    expect(car.body.message).toMatch(/no such car in your workshop/)
  })
})

describe('reading quotes', () => {
  // Made on first use: the test server's context exists only inside tests, not in a nested beforeAll.
  let made: Promise<{ draft: Created, out: Created }> | undefined
  const quotes = () => made ??= (async () => ({ draft: await create(), out: await sent() }))()

  it.each([
    ['anonymous', 401, 401], ['owner', 200, 200], ['tuner', 200, 200], ['fabricator', 200, 200],
    ['driver', 404, 200], ['driver2', 404, 404], ['foreignOwner', 404, 404], ['foreignDriver', 404, 404],
  ] as const)('%s → %i for a draft, %i for a sent quote', async (who, draftStatus, sentStatus) => {
    const { draft, out } = await quotes()
    expect((await clients[who].get(`/api/quotes/${draft.id}`)).status).toBe(draftStatus)
    expect((await clients[who].get(`/api/quotes/${out.id}`)).status).toBe(sentStatus)
  })

  it('lists for each role only what it may see, filtered by car and state', async () => {
    const { draft, out } = await quotes()
    const ids_ = async (who: Who, query = '') => (await clients[who].get<Array<{ id: number }>>(`/api/quotes${query}`)).body.map(q => q.id)
    expect(await ids_('tuner')).toEqual(expect.arrayContaining([draft.id, out.id]))
    expect(await ids_('driver')).toContain(out.id)
    expect(await ids_('driver')).not.toContain(draft.id)
    expect(await ids_('driver2')).not.toContain(out.id)
    expect(await ids_('foreignOwner')).not.toContain(out.id)
    expect(await ids_('fabricator', '?status=draft')).toContain(draft.id)
    expect(await ids_('fabricator', '?status=draft')).not.toContain(out.id)
    expect(await ids_('fabricator', `?vehicleId=${ids.driver2Car}`)).not.toContain(out.id)
    const bad = await clients.fabricator.get<{ message: string }>('/api/quotes?status=paid')
    expect(bad.status).toBe(400)
    expect((await clients.anonymous.get('/api/quotes')).status).toBe(401)
  })

  it('pages, searches and sorts the quote table on the server, within what each role may see', async () => {
    const { draft, out } = await quotes()
    interface Page { items: Array<{ id: number, number: string, totalCents: number, vehicle: { description: string } }>, total: number, page: number, pageSize: number }
    const all = (await clients.fabricator.get<Array<{ id: number }>>('/api/quotes')).body
    const first = await clients.fabricator.get<Page>('/api/quotes?page=1&pageSize=10')
    expect(first.status).toBe(200)
    expect(first.body.total).toBe(all.length)
    expect(first.body.items).toHaveLength(Math.min(10, all.length))
    expect(first.body.items.map(q => q.id)).toEqual(all.slice(0, 10).map(q => q.id))

    const found = await clients.fabricator.get<Page>(`/api/quotes?page=1&q=${encodeURIComponent(draft.number.toLowerCase())}`)
    expect(found.body.items.map(q => q.id)).toEqual([draft.id])
    expect(found.body.total).toBe(1)
    const byCar = await clients.fabricator.get<Page>(`/api/quotes?page=1&pageSize=100&q=${encodeURIComponent(first.body.items[0]!.vehicle.description.slice(0, 12))}`)
    expect(byCar.body.items.length).toBeGreaterThan(0)

    const dearest = await clients.fabricator.get<Page>('/api/quotes?page=1&pageSize=100&sort=total&dir=desc')
    const totals = dearest.body.items.map(q => q.totalCents)
    expect(totals).toEqual([...totals].sort((a, b) => b - a))
    const cheapest = await clients.fabricator.get<Page>('/api/quotes?page=1&pageSize=100&sort=total&dir=asc')
    expect(cheapest.body.items.map(q => q.totalCents)).toEqual([...totals].reverse())

    const driver = await clients.driver.get<Page>('/api/quotes?page=1&pageSize=100')
    expect(driver.body.items.map(q => q.id)).toContain(out.id)
    expect(driver.body.items.map(q => q.id)).not.toContain(draft.id)
    expect((await clients.driver.get<Page>(`/api/quotes?page=1&q=${encodeURIComponent(draft.number)}`)).body).toMatchObject({ items: [], total: 0 })

    const bad: Array<[string, RegExp]> = [
      ['sort=total_cents', /sort by one of: number, car, status, validUntil, total/],
      ['dir=up', /the order is asc or desc/],
      ['page=0', /pages start at 1/],
      ['page=1&pageSize=7', /a page holds 10, 25, 50, 100 quotes/],
      [`page=1&q=${'x'.repeat(81)}`, /keep the search under 80 characters/],
    ]
    for (const [query, message] of bad) {
      const reply = await clients.fabricator.get<{ message: string }>(`/api/quotes?${query}`)
      expect(reply.status, query).toBe(400)
      expect(reply.body.message).toMatch(message)
    }
  })

  it.each([
    ['anonymous', 401], ['tuner', 200], ['fabricator', 200], ['driver', 200], ['driver2', 404], ['foreignOwner', 404],
  ] as const)('%s → %i downloading the PDF', async (who, status) => {
    const { out } = await quotes()
    const reply = await rawGet(clients[who], `/api/quotes/${out.id}/pdf`)
    expect(reply.status).toBe(status)
  })

  it('gives the fabricator the workshop defaults and the core\'s price for a new quote', async () => {
    const reply = await clients.fabricator.get<{ core: { priceCents: number }, depositPct: number, labourRateCents: number }>(`/api/quotes/prefill?vehicleId=${ids.driverCar}&coreId=${ids.frontMount}`)
    expect(reply.status).toBe(200)
    expect(reply.body).toMatchObject({ core: { priceCents: 64_000 }, depositPct: 30, labourRateCents: 8500 })
    expect((await clients.tuner.get('/api/quotes/prefill')).status).toBe(403)
    expect((await clients.anonymous.get('/api/quotes/prefill')).status).toBe(401)
    expect((await clients.foreignOwner.get<{ core: null }>(`/api/quotes/prefill?coreId=${ids.frontMount}`)).body.core).toBeNull()
  })
})

describe('the PDF and the e-mail', () => {
  it('renders the quote with its number and total in the text, and e-mails it to the customer', async () => {
    const quote = await sent()
    const total = formatMoney(quote.totalCents, 'EUR')
    const reply = await rawGet(clients.driver, `/api/quotes/${quote.id}/pdf`)
    expect(reply.headers.get('content-type')).toBe('application/pdf')
    expect(reply.headers.get('content-disposition')).toContain(`${quote.number}.pdf`)
    const text = await pdfText(new Uint8Array(await reply.arrayBuffer()))
    expect(text).toContain(`Quote ${quote.number}`)
    expect(text).toContain(total)
    expect(text).toContain('Kestrel Road Performance')
    expect(text).toMatch(/pressure-tested/)

    const mail = one<{ to_email: string, subject: string, text: string, kind: string, attachments: string }>('select * from outbox where kind = \'quote\' order by id desc limit 1')
    expect(mail).toMatchObject({ to_email: EMAILS.driver, kind: 'quote' })
    expect(mail.subject).toContain(quote.number)
    expect(mail.text).toContain(`/quotes/${quote.id}`)
    const [attachment] = JSON.parse(mail.attachments) as Array<{ filename: string, contentType: string, size: number, contentBase64: string }>
    expect(attachment).toMatchObject({ filename: `${quote.number}.pdf`, contentType: 'application/pdf' })
    const bytes = Buffer.from(attachment!.contentBase64, 'base64')
    expect(bytes.byteLength).toBe(attachment!.size)
    const attached = await pdfText(new Uint8Array(bytes))
    expect(attached).toContain(quote.number)
    expect(attached).toContain(total)
  })
})

describe('changing and moving a quote', () => {
  it.each([
    ['anonymous', 401], ['tuner', 403], ['driver', 404], ['driver2', 404], ['foreignOwner', 404], ['owner', 200],
  ] as const)('%s → %i sending a draft', async (who, status) => {
    const quote = await create()
    const before = count('select count(*) n from outbox')
    expect((await clients[who].post(`/api/quotes/${quote.id}/send`)).status).toBe(status)
    expect(count('select count(*) n from outbox')).toBe(before + (status === 200 ? 1 : 0))
  })

  it('writes only the keys sent, and recomputes the totals', async () => {
    const quote = await create()
    const reply = await clients.fabricator.patch<Detail>(`/api/quotes/${quote.id}`, { terms: 'Collect within a week.', taxRatePct: 10 })
    expect(reply.status).toBe(200)
    expect(reply.body.terms).toBe('Collect within a week.')
    expect(reply.body.lines).toHaveLength(LINES.length)
    expect(reply.body.totalCents).toBe(quoteTotals(LINES, 10, 30).totalCents)
    expect(reply.body.depositPct).toBe(30)
  })

  it.each([
    ['anonymous', 401], ['tuner', 403], ['owner', 200], ['driver2', 404], ['foreignOwner', 404],
  ] as const)('%s → %i changing a draft', async (who, status) => {
    const quote = await create()
    expect((await clients[who].patch(`/api/quotes/${quote.id}`, { notes: who })).status).toBe(status)
  })

  it('refuses bad changes and leaves the draft as it was', async () => {
    const quote = await create()
    const before = one('select * from quotes where id = ?', quote.id)
    const lines = readDatabase(db => db.prepare('select * from quote_lines where quote_id = ?').all(quote.id))
    for (const change of [{ lines: [{ ...LINES[0], quantity: -2 }] }, { lines: [{ ...LINES[0], unitPriceCents: 1.5 }] }, { lines: [] }, { coreId: ids.foreignCore }, { vehicleId: ids.driver2Car }]) {
      expect((await clients.fabricator.patch(`/api/quotes/${quote.id}`, change)).status).toBe(400)
    }
    expect(one('select * from quotes where id = ?', quote.id)).toEqual(before)
    expect(readDatabase(db => db.prepare('select * from quote_lines where quote_id = ?').all(quote.id))).toEqual(lines)
  })

  it('refuses editing a sent quote (409) until it is revised back to draft', async () => {
    const quote = await sent()
    const refused = await clients.fabricator.patch<{ message: string }>(`/api/quotes/${quote.id}`, { terms: 'changed' })
    expect(refused.status).toBe(409)
    expect(refused.body.message).toMatch(/revise it first/)
    expect((await clients.driver.post(`/api/quotes/${quote.id}/revise`)).status).toBe(403)
    const revised = await clients.fabricator.post<Detail>(`/api/quotes/${quote.id}/revise`)
    expect(revised.body).toMatchObject({ status: 'draft', revision: 2, number: quote.number })
    expect((await clients.fabricator.patch(`/api/quotes/${quote.id}`, { terms: 'changed' })).status).toBe(200)
    expect((await clients.fabricator.post(`/api/quotes/${quote.id}/send`)).status).toBe(200)
    expect(one<{ n: number }>('select count(*) n from audit_events where entity = \'quote\' and entity_id = ? and action in (\'send\', \'revise\')', quote.id).n).toBe(3)
  })

  it.each([
    ['anonymous', 401], ['owner', 403], ['tuner', 403], ['fabricator', 403], ['driver2', 404], ['foreignDriver', 404],
  ] as const)('%s → %i accepting or declining the driver\'s quote', async (who, status) => {
    const quote = await sent()
    expect((await clients[who].post(`/api/quotes/${quote.id}/accept`)).status).toBe(status)
    expect((await clients[who].post(`/api/quotes/${quote.id}/decline`)).status).toBe(status)
    expect(one<{ status: string }>('select status from quotes where id = ?', quote.id).status).toBe('sent')
  })

  it('refuses paying a declined quote and other illegal moves with 409 and a message', async () => {
    const quote = await sent()
    expect((await clients.fabricator.post(`/api/quotes/${quote.id}/start`)).status).toBe(409)
    const early = await clients.driver.post<{ message: string }>(`/api/quotes/${quote.id}/checkout`)
    expect(early.status).toBe(409)
    expect(early.body.message).toMatch(/Accept the quote before paying/)
    expect((await clients.driver.post(`/api/quotes/${quote.id}/decline`)).status).toBe(200)
    const pay = await clients.driver.post<{ message: string }>(`/api/quotes/${quote.id}/checkout`)
    expect(pay.status).toBe(409)
    expect(pay.body.message).toBe('This quote is declined, so it cannot be paid.')
    expect((await clients.driver.post(`/api/quotes/${quote.id}/accept`)).status).toBe(409)
    expect((await clients.fabricator.post(`/api/quotes/${quote.id}/send`)).status).toBe(409)
  })

  it('lets the workshop cancel before the deposit, and the staff moves need staff', async () => {
    const quote = await sent()
    expect((await clients.driver.post(`/api/quotes/${quote.id}/cancel`)).status).toBe(403)
    expect((await clients.tuner.post(`/api/quotes/${quote.id}/cancel`)).status).toBe(403)
    expect((await clients.foreignOwner.post(`/api/quotes/${quote.id}/cancel`)).status).toBe(404)
    expect((await clients.owner.post<Detail>(`/api/quotes/${quote.id}/cancel`)).body.status).toBe('cancelled')
    const revise = await clients.owner.post<{ message: string }>(`/api/quotes/${quote.id}/revise`)
    expect(revise.status).toBe(409)
    expect(revise.body.message).toBe('This quote is cancelled, so it cannot be revised.')
  })

  it('expires a sent quote past its valid-until day on the next read, and then refuses accepting it', async () => {
    const quote = await sent()
    writeDatabase('update quotes set valid_until = ? where id = ?', '2020-01-31', quote.id)
    expect((await clients.driver.get<Detail>(`/api/quotes/${quote.id}`)).body.status).toBe('expired')
    const accept = await clients.driver.post<{ message: string }>(`/api/quotes/${quote.id}/accept`)
    expect(accept.status).toBe(409)
    expect(accept.body.message).toBe('This quote is expired, so it cannot be accepted.')
    expect(one<{ action: string, user_id: number | null }>('select action, user_id from audit_events where entity = \'quote\' and entity_id = ? order by id desc limit 1', quote.id)).toEqual({ action: 'expire', user_id: null })
  })
})

describe('the deposit', () => {
  it.each([
    ['anonymous', 401], ['owner', 403], ['fabricator', 403], ['tuner', 403], ['driver2', 404], ['foreignDriver', 404],
  ] as const)('%s → %i starting the driver\'s checkout', async (who, status) => {
    const quote = await accepted()
    expect((await clients[who].post(`/api/quotes/${quote.id}/checkout`)).status).toBe(status)
  })

  it('goes checkout → the stand-in\'s page → its form post → signed notice → deposit paid', async () => {
    const quote = await accepted()
    const checkout = await clients.driver.post<{ url: string }>(`/api/quotes/${quote.id}/checkout`)
    expect(checkout.status).toBe(200)
    expect(checkout.body.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/pay\/cs_local_/)
    const page = await fetch(checkout.body.url)
    const html = await page.text()
    expect(html).toContain(formatMoney(quote.depositCents, 'EUR'))
    expect(html).toContain(`Deposit for quote ${quote.number}`)
    expect(html).toMatch(/<form method="post"/)

    const before = footprint()
    const paid = await fetch(checkout.body.url, { method: 'POST', redirect: 'manual' })
    expect(paid.status).toBe(303)
    expect(paid.headers.get('location')).toBe(`${inject('baseUrl')}/quotes/${quote.id}?payment=done`)

    const detail = await clients.driver.get<Detail & { payments: Array<{ amountCents: number, status: string }> }>(`/api/quotes/${quote.id}`)
    expect(detail.body.status).toBe('deposit_paid')
    expect(detail.body.paidAt).not.toBeNull()
    expect(detail.body.payments).toEqual([expect.objectContaining({ amountCents: quote.depositCents, status: 'succeeded' })])
    const after = footprint()
    expect(after.payments).toBe(before.payments + 1)
    expect(after.events).toBe(before.events + 1)
    const told = readDatabase(db => db.prepare('select to_email from outbox where kind = \'payment\' and subject like ?').all(`%${quote.number}%`)).map(r => (r as { to_email: string }).to_email)
    // Every owner and fabricator of the workshop (other test files may have invited more), and nobody else.
    const quoteMakers = readDatabase(db => db.prepare('select email from users where workshop_id = (select workshop_id from users where email = ?) and role in (\'owner\', \'fabricator\')').all(EMAILS.owner)).map(r => (r as { email: string }).email)
    expect(quoteMakers).toEqual(expect.arrayContaining([EMAILS.fabricator, EMAILS.owner]))
    expect(told.sort()).toEqual(quoteMakers.sort())
    expect(one<{ user_id: number, action: string }>('select user_id, action from audit_events where entity = \'quote\' and entity_id = ? order by id desc limit 1', quote.id))
      .toEqual({ action: 'pay', user_id: one<{ id: number }>('select id from users where email = ?', EMAILS.driver).id })

    // The form posted twice (a double tap) pays once.
    const again = await fetch(checkout.body.url, { method: 'POST', redirect: 'manual' })
    expect(again.status).toBe(303)
    expect(footprint().payments).toBe(after.payments)

    // Then the workshop's moves, in order.
    expect((await clients.driver.post(`/api/quotes/${quote.id}/start`)).status).toBe(403)
    const cancel = await clients.fabricator.post<{ message: string }>(`/api/quotes/${quote.id}/cancel`)
    expect(cancel.status).toBe(409)
    expect(cancel.body.message).toBe('A deposit has been paid on this quote: settle the refund with the customer first; Densitas does not cancel paid work.')
    expect((await clients.fabricator.post<Detail>(`/api/quotes/${quote.id}/start`)).body.status).toBe('in_progress')
    expect((await clients.fabricator.post<Detail>(`/api/quotes/${quote.id}/complete`)).body.status).toBe('completed')
    const twice = await clients.fabricator.post<{ message: string }>(`/api/quotes/${quote.id}/complete`)
    expect(twice.status).toBe(409)
    expect(twice.body.message).toBe('This quote is already completed.')
  })

  it('ignores a replayed notice: the second delivery changes nothing', async () => {
    const quote = await accepted()
    const { payload, signature } = signedNotice(quote)
    expect((await postNotice(payload, signature)).status).toBe(200)
    expect(one<{ status: string }>('select status from quotes where id = ?', quote.id).status).toBe('deposit_paid')
    const before = footprint()
    const replay = await postNotice(payload, signature)
    expect(replay.status).toBe(200)
    expect(await replay.json()).toMatchObject({ duplicate: true })
    expect(footprint()).toEqual(before)
  })

  it('refuses an unsigned, a tampered or a wrongly signed notice, storing nothing', async () => {
    const quote = await accepted()
    const { payload, signature } = signedNotice(quote)
    const before = footprint()
    expect((await postNotice(payload)).status).toBe(400)
    expect((await postNotice(payload.replace(`"amount_total":${quote.depositCents}`, '"amount_total":1'), signature)).status).toBe(400)
    const forged = stripe.webhooks.generateTestHeaderString({ payload, secret: 'whsec_someone_else' })
    expect((await postNotice(payload, forged)).status).toBe(400)
    expect((await postNotice(payload, 't=1,v1=00')).status).toBe(400)
    expect(footprint()).toEqual(before)
    expect(one<{ status: string }>('select status from quotes where id = ?', quote.id).status).toBe('accepted')
  })

  it('does not let a notice name another workshop\'s quote', async () => {
    const quote = await accepted()
    const { payload, signature } = signedNotice(quote, { metadata: { quoteId: String(quote.id), workshopId: '999' } })
    const reply = await postNotice(payload, signature)
    expect(reply.status).toBe(200)
    expect(one<{ status: string }>('select status from quotes where id = ?', quote.id).status).toBe('accepted')
  })
})
