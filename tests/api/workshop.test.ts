import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { addDaysUtc, quoteTotals, todayUtc } from '../../shared/utils/quotes'
import { Client, readDatabase, signIn, useTestServer } from './client'

await useTestServer()

// The owner's quote defaults on the workshop page: tax rate, how long a quote is valid, the terms.

interface WorkshopRow { id: number, name: string, currency: string, labour_rate_cents: number, deposit_percent: number, correction_standard: string, tax_rate_pct: number, quote_validity_days: number, quote_terms: string }
const row = () => readDatabase(db => db.prepare('select w.* from workshops w join users u on u.workshop_id = w.id where u.email = ?').get('owner@kestrel.test') as WorkshopRow)
const auditCount = () => readDatabase(db => (db.prepare('select count(*) n from audit_events where entity = \'workshop\' and entity_id = ?').get(row().id) as { n: number }).n)
const writes = () => ({ workshop: row(), audit: auditCount() })

const clients = {} as Record<'anonymous' | 'owner' | 'tuner' | 'fabricator' | 'driver', Client>
let start: WorkshopRow
let driverCar = 0

beforeAll(async () => {
  clients.anonymous = new Client()
  clients.owner = await signIn('owner@kestrel.test')
  clients.tuner = await signIn('tuner@kestrel.test')
  clients.fabricator = await signIn('fab@kestrel.test')
  clients.driver = await signIn('driver@kestrel.test')
  start = row()
  driverCar = readDatabase(db => (db.prepare('select v.id from vehicles v join users u on u.id = v.owner_id where u.email = ? order by v.id limit 1').get('driver@kestrel.test') as { id: number }).id)
})

// Put the demo workshop back as it was for the files that run after this one (written directly:
// the test server's context exists only inside tests).
afterAll(() => {
  const db = new Database(`${inject('dataDir')}/densitas.sqlite`)
  try {
    db.pragma('busy_timeout = 5000')
    db.prepare('update workshops set tax_rate_pct = ?, quote_validity_days = ?, quote_terms = ? where id = ?').run(start.tax_rate_pct, start.quote_validity_days, start.quote_terms, start.id)
  }
  finally {
    db.close()
  }
})

describe('the quote defaults on the workshop record', () => {
  it('saves the tax rate, validity and terms, audits the change, and shows them back', async () => {
    const before = auditCount()
    const reply = await clients.owner.patch<{ taxRatePct: number, quoteValidityDays: number, quoteTerms: string }>('/api/workshop', { taxRatePct: 8.25, quoteValidityDays: 14, quoteTerms: '  Deposit books the job. Balance on collection.  ' })
    expect(reply.status).toBe(200)
    expect(reply.body).toMatchObject({ taxRatePct: 8.25, quoteValidityDays: 14, quoteTerms: 'Deposit books the job. Balance on collection.' })
    expect(row()).toMatchObject({ tax_rate_pct: 8.25, quote_validity_days: 14, quote_terms: 'Deposit books the job. Balance on collection.' })
    expect(auditCount()).toBe(before + 1)
    const audit = readDatabase(db => db.prepare('select user_id, detail from audit_events where entity = \'workshop\' order by id desc limit 1').get() as { user_id: number, detail: string })
    expect(JSON.parse(audit.detail)).toEqual({ taxRatePct: 8.25, quoteValidityDays: 14, quoteTerms: 'Deposit books the job. Balance on collection.' })
    const read = await clients.owner.get<{ taxRatePct: number, quoteValidityDays: number, quoteTerms: string }>('/api/workshop')
    expect(read.body).toMatchObject({ taxRatePct: 8.25, quoteValidityDays: 14 })
  })

  it('changes only the fields sent: a tax rate alone keeps the terms, validity and prices', async () => {
    await clients.owner.patch('/api/workshop', { quoteValidityDays: 21, quoteTerms: 'Kept terms.' })
    const before = row()
    expect((await clients.owner.patch('/api/workshop', { taxRatePct: 0 })).status).toBe(200)
    expect(row()).toEqual({ ...before, tax_rate_pct: 0 })
    expect((await clients.owner.patch('/api/workshop', { quoteTerms: '' })).status).toBe(200)
    expect(row()).toEqual({ ...before, tax_rate_pct: 0, quote_terms: '' })
  })

  it.each([
    ['a tax rate over 50 %', { taxRatePct: 50.5 }, /the tax rate is 0–50 %/],
    ['a negative tax rate', { taxRatePct: -1 }, /the tax rate is 0–50 %/],
    ['a tax rate with three decimals', { taxRatePct: 7.125 }, /tax rate has at most two decimals/],
    ['a tax rate as text', { taxRatePct: '20' }, /enter the tax rate in %, 0 to 50/],
    ['a quote valid for 0 days', { quoteValidityDays: 0 }, /Quote validity: a quote is valid for 1 to 365 days/],
    ['a quote valid for over a year', { quoteValidityDays: 366 }, /a quote is valid for 1 to 365 days/],
    ['half a day', { quoteValidityDays: 10.5 }, /whole number of days, 1 to 365/],
    ['terms over 4 000 characters', { quoteTerms: 'x'.repeat(4001) }, /keep the quote terms under 4 000 characters/],
    ['terms that are not text', { quoteTerms: 12 }, /write the quote terms as text/],
  ])('refuses %s with 400 and a plain message, writing nothing', async (_what, body, message) => {
    const before = writes()
    const reply = await clients.owner.patch<{ message: string }>('/api/workshop', { ...body, labourRateCents: 1 })
    expect(reply.status).toBe(400)
    expect(reply.body.message).toMatch(message)
    expect(reply.body.message).not.toMatch(/taxRatePct|quoteValidityDays|quoteTerms/)
    expect(writes()).toEqual(before)
  })

  it.each([
    ['anonymous', 401], ['tuner', 403], ['fabricator', 403], ['driver', 403],
  ] as const)('refuses %s (%i) and changes nothing', async (who, status) => {
    const before = writes()
    const reply = await clients[who].patch<{ message: string }>('/api/workshop', { taxRatePct: 5, quoteValidityDays: 3, quoteTerms: 'Not theirs.' })
    expect(reply.status).toBe(status)
    if (status === 403) expect(reply.body.message).toMatch(/Only the workshop owner changes/)
    expect(writes()).toEqual(before)
  })
})

describe('a new quote starts from the workshop\'s defaults', () => {
  const LINES = [{ description: 'Labour, hours', quantity: 4, unitPriceCents: 8_000 }]

  it('takes the tax rate, validity and terms when the quote does not give its own', async () => {
    expect((await clients.owner.patch('/api/workshop', { taxRatePct: 12.5, quoteValidityDays: 10, quoteTerms: 'Ten days to decide.' })).status).toBe(200)
    const prefill = await clients.fabricator.get<{ taxRatePct: number, validUntil: string, terms: string }>(`/api/quotes/prefill?vehicleId=${driverCar}`)
    expect(prefill.body).toMatchObject({ taxRatePct: 12.5, validUntil: addDaysUtc(todayUtc(), 10), terms: 'Ten days to decide.' })

    const created = await clients.fabricator.post<{ id: number, totalCents: number }>('/api/quotes', { vehicleId: driverCar, lines: LINES })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    const quote = await clients.fabricator.get<{ taxRatePct: number, taxCents: number, validUntil: string, terms: string }>(`/api/quotes/${created.body.id}`)
    const expected = quoteTotals(LINES, 12.5, start.deposit_percent)
    expect(quote.body).toMatchObject({ taxRatePct: 12.5, taxCents: expected.taxCents, validUntil: addDaysUtc(todayUtc(), 10), terms: 'Ten days to decide.' })
    expect(created.body.totalCents).toBe(expected.totalCents)
  })

  it('keeps a quote\'s own tax rate, date and terms when it gives them', async () => {
    const validUntil = addDaysUtc(todayUtc(), 40)
    const created = await clients.fabricator.post<{ id: number }>('/api/quotes', { vehicleId: driverCar, lines: LINES, taxRatePct: 20, validUntil, terms: 'Own terms.' })
    expect(created.status).toBe(201)
    const quote = await clients.fabricator.get<{ taxRatePct: number, validUntil: string, terms: string }>(`/api/quotes/${created.body.id}`)
    expect(quote.body).toMatchObject({ taxRatePct: 20, validUntil, terms: 'Own terms.' })
  })
})
