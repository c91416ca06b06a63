import { describe, expect, it } from 'vitest'
import { formatMoney } from '../../shared/utils/format'
import { quoteTotals } from '../../shared/utils/quotes'
import { readDatabase } from '../api/client'
import { DESKTOP, openBrowser, PHONE, screenshot, signInThroughPage } from './browser'

const one = <T>(sql: string, ...args: unknown[]) => readDatabase(db => db.prepare(sql).get(...args) as T)

// Issue 9's journey in one piece: the fabricator sizes three cores for the demo car, quotes the
// best and sends it; the driver, on a phone, opens the quote, accepts and pays; the quote shows
// paid. Each step leads to the next by what a person clicks, never by an address typed in.
describe('from sizing a front-mount to the paid deposit', () => {
  it('the fabricator sizes, quotes the best core and sends it; the driver accepts and pays on a phone', async () => {
    let quoteNumber: string
    let quoteId: number

    const fabricator = await openBrowser(DESKTOP)
    try {
      const { page } = fabricator
      // 1. Sign in, open the demo car, start sizing.
      await signInThroughPage(page, 'fab@kestrel.test')
      await page.getByTestId('home-fabricator').waitFor()
      await screenshot(page, 'journey-01-fabricator-home')
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Cars' }).click()
      await page.getByRole('link', { name: '2.0 L four-cylinder turbo-diesel hatchback' }).click()
      await page.getByTestId('size-front-mount').waitFor()
      await screenshot(page, 'journey-02-car')
      await page.getByTestId('size-front-mount').click()
      await page.getByTestId('sizing-form').waitFor()

      // 2. The log made with the factory core is offered first, every larger core ticked; keep three.
      expect(await page.getByTestId('sizing-log').locator('option:checked').textContent()).toMatch(/stock-core/)
      const boxes = page.locator('[data-testid^="candidate-"]')
      let ticked = 0
      for (let i = 0; i < await boxes.count(); i++) {
        if (await boxes.nth(i).isChecked()) ticked++
        await boxes.nth(i).uncheck()
      }
      expect(ticked).toBeGreaterThanOrEqual(4)
      const three = ['Compact front-mount 550', 'Kestrel bar-and-plate front-mount 600', 'Kestrel tube-and-fin front-mount 650']
        .map(name => one<{ id: number }>('select id from cores where name = ?', name).id)
      for (const id of three) await page.getByTestId(`candidate-${id}`).check()
      await page.getByLabel('Ambient temperature (°C)').fill('35')
      await screenshot(page, 'journey-03-sizing-form')

      // 3. Run: three cores ranked, the cautions, the fitted core named, and beside each core what
      // the workshop measured with it: the 600 has the demo's after-log, the 550 no log at all.
      await page.getByTestId('sizing-run').click()
      await page.getByTestId('sizing-table').waitFor()
      const rows = page.getByTestId('sizing-row')
      expect(await rows.count()).toBe(3)
      expect((await rows.first().locator('td').first().textContent())?.trim()).toBe('1')
      expect(await rows.first().textContent()).toMatch(/Best:/)
      await expect(page.getByTestId('sizing-cautions').textContent()).resolves.toMatch(/Pressure-test the charge system/)
      expect(await page.getByTestId('sizing-calibration').textContent()).toMatch(/Factory side-mount core \(small\)/)
      await page.getByTestId(`measured-${three[1]}`).getByText(/over \d+ pulls/).waitFor()
      await expect(page.getByTestId(`measured-${three[1]}`).textContent()).resolves.toMatch(/measured here: \d+ %.*over \d+ pulls, \d+ logs?, \d+ cars?/)
      await expect(page.getByTestId(`measured-${three[0]}`).textContent()).resolves.toMatch(/not measured here yet/)
      await screenshot(page, 'journey-04-sizing-ranked')

      // 4. "Quote this core" on the top-ranked core: the quote form starts with that core's line at
      // its catalogue sell price, and the sizing's figures.
      const top = rows.first().locator('[data-testid^="quote-core-"]')
      const href = (await top.getAttribute('href'))!
      const [, sizingId, coreId] = href.match(/^\/quotes\/new\?vehicleId=\d+&sizingId=(\d+)&coreId=(\d+)$/)!.map(Number)
      const core = one<{ name: string, price_cents: number }>('select name, price_cents from cores where id = ?', coreId)
      expect(await rows.first().textContent()).toContain(core.name)
      await top.click()
      await page.getByTestId('quote-form').waitFor()
      await expect(page.locator('#line-desc-0').inputValue()).resolves.toBe(`Core: ${core.name}`)
      await expect(page.locator('#line-price-0').inputValue()).resolves.toBe(String(core.price_cents / 100))
      await expect(page.getByTestId('quote-sizing-note').textContent()).resolves.toMatch(/predicted effectiveness \d+ %/)

      // 5. Lines: pipework and labour; the totals follow as they are typed.
      await page.getByRole('button', { name: 'Pipework (per metre)' }).click()
      await page.locator('#line-qty-1').fill('2.5')
      await page.locator('#line-price-1').fill('31.40')
      await page.getByRole('button', { name: /^Labour/ }).click()
      await page.locator('#line-qty-2').fill('5')
      const expected = quoteTotals([
        { quantity: 1, unitPriceCents: core.price_cents },
        { quantity: 2.5, unitPriceCents: 3_140 },
        { quantity: 5, unitPriceCents: 8_500 },
      ], 20, 30)
      await expect(page.getByTestId('quote-total').textContent()).resolves.toContain(formatMoney(expected.totalCents, 'EUR'))
      await expect(page.getByTestId('quote-deposit').textContent()).resolves.toContain(formatMoney(expected.depositCents, 'EUR'))
      await screenshot(page, 'journey-05-quote-lines')

      // 6. Save: a draft that keeps the sizing it came from.
      await page.getByRole('button', { name: 'Save draft' }).click()
      await page.getByTestId('quote-send').waitFor()
      quoteNumber = (await page.getByTestId('quote-number').textContent())!.replace('Quote ', '').trim()
      quoteId = Number(new URL(page.url()).pathname.split('/').pop())
      await expect(page.getByTestId('quote-status').textContent()).resolves.toBe('Draft')
      expect(one<{ sizing_id: number, core_id: number }>('select sizing_id, core_id from quotes where id = ?', quoteId)).toEqual({ sizing_id: sizingId, core_id: coreId })
      await screenshot(page, 'journey-06-quote-draft')

      // 7. Send.
      await page.getByTestId('quote-send').click()
      await page.getByText('The quote with its PDF was e-mailed to').waitFor()
      await expect(page.getByTestId('quote-status').textContent()).resolves.toBe('Sent')
      await screenshot(page, 'journey-07-quote-sent')
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Quotes', exact: true }).click()
      await page.getByTestId('quote-list').getByRole('link', { name: quoteNumber }).waitFor()

      // 8. The outbox shows the e-mail, sent, with the quote's PDF.
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Outbox', exact: true }).click()
      await page.getByTestId('outbox-table').waitFor()
      const mail = page.getByTestId('outbox-row').filter({ hasText: quoteNumber })
      await expect(mail.count()).resolves.toBe(1)
      // Sent at once to the test mailbox, or by the sweep within seconds; the page looks again on its own.
      await page.waitForFunction(n => [...document.querySelectorAll('[data-testid="outbox-row"]')].some(row => row.textContent?.includes(n) && row.getAttribute('data-status') === 'sent'), quoteNumber, { timeout: 20_000 })
      await expect(mail.getByTestId('outbox-attachment').textContent()).resolves.toMatch(new RegExp(`${quoteNumber}\\.pdf\\s*[\\d.]+ k?B, arrived`))
      await screenshot(page, 'journey-08-outbox')
    }
    finally {
      await fabricator.close()
    }

    // 9. The driver, on a 390 px phone: the car page, the quote, accept, pay, paid.
    const driver = await openBrowser(PHONE)
    try {
      const { page } = driver
      await signInThroughPage(page, 'driver@kestrel.test')
      await page.getByTestId('home-driver').waitFor()
      await page.getByTestId('vehicle-list').getByRole('link', { name: /2\.0 L four-cylinder turbo-diesel hatchback/ }).first().click()
      await page.getByTestId('vehicle-quotes').waitFor()
      await screenshot(page, 'journey-09-driver-car')
      await page.getByTestId('vehicle-quotes').getByRole('link', { name: quoteNumber }).click()
      await page.getByTestId('quote-answer').waitFor()
      await expect(page.getByTestId('fabrication-cautions').isVisible()).resolves.toBe(true)
      // Nothing sticks out sideways on a phone.
      await expect(page.evaluate(() => document.documentElement.scrollWidth)).resolves.toBeLessThanOrEqual(PHONE.width)
      await screenshot(page, 'journey-10-driver-quote')

      await page.getByRole('button', { name: 'Accept the quote' }).click()
      await page.getByTestId('quote-pay').waitFor()
      await expect(page.getByTestId('quote-status').textContent()).resolves.toBe('Accepted')
      await screenshot(page, 'journey-11-driver-accepted')
      await page.getByTestId('quote-pay').click()
      await page.waitForURL(/\/pay\/cs_local_/)
      await expect(page.getByTestId('checkout-amount').textContent()).resolves.toMatch(/€/)
      await screenshot(page, 'journey-12-practice-checkout')
      await page.getByRole('button', { name: /^Pay / }).click()

      await page.waitForURL(new RegExp(`/quotes/${quoteId}\\?payment=done`))
      await page.getByTestId('quote-paid-notice').waitFor()
      await expect(page.getByTestId('quote-status').textContent()).resolves.toBe('Deposit paid')
      await expect(page.getByTestId('quote-paid').textContent()).resolves.toMatch(/paid on/)
      await screenshot(page, 'journey-13-driver-paid')
      expect(one<{ status: string }>('select status from quotes where id = ?', quoteId).status).toBe('deposit_paid')
    }
    finally {
      await driver.close()
    }
  }, 240_000)
})
