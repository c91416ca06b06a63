import { describe, expect, it } from 'vitest'
import { formatMoney } from '../../shared/utils/format'
import { quoteTotals } from '../../shared/utils/quotes'
import { readDatabase } from '../api/client'
import { DESKTOP, openBrowser, PHONE, screenshot, signInThroughPage } from './browser'

const one = <T>(sql: string, ...args: unknown[]) => readDatabase(db => db.prepare(sql).get(...args) as T)

describe('a quote from the fabricator to the paid deposit', () => {
  let quoteNumber = ''
  let quoteId = 0

  it('the fabricator writes a quote with live totals and sends it', async () => {
    const car = one<{ id: number }>('select v.id from vehicles v join users u on u.id = v.owner_id where u.email = ?', 'driver@kestrel.test').id
    const core = one<{ id: number }>('select id from cores where name = ?', 'Compact front-mount 550').id
    const browser = await openBrowser(DESKTOP)
    try {
      const { page } = browser
      await signInThroughPage(page, 'fab@kestrel.test')
      await page.getByTestId('home-fabricator').waitFor()
      // The way the sizing page links here: car and core in the address.
      await page.goto(`/quotes/new?vehicleId=${car}&coreId=${core}`)
      await page.getByTestId('quote-form').waitFor()
      await expect(page.locator('#line-desc-0').inputValue()).resolves.toBe('Core: Compact front-mount 550')
      await expect(page.locator('#line-price-0').inputValue()).resolves.toBe('480')

      await page.getByRole('button', { name: 'Pipework (per metre)' }).click()
      await page.locator('#line-qty-1').fill('2.5')
      await page.locator('#line-price-1').fill('31.40')
      await page.getByRole('button', { name: /^Labour/ }).click()
      await page.locator('#line-qty-2').fill('5')
      const expected = quoteTotals([
        { quantity: 1, unitPriceCents: 48_000 },
        { quantity: 2.5, unitPriceCents: 3_140 },
        { quantity: 5, unitPriceCents: 8_500 },
      ], 20, 30)
      await expect(page.getByTestId('quote-total').textContent()).resolves.toContain(formatMoney(expected.totalCents, 'EUR'))
      await expect(page.getByTestId('quote-deposit').textContent()).resolves.toContain(formatMoney(expected.depositCents, 'EUR'))
      await screenshot(page, 'quotes-desktop-fabricator-new')

      await page.getByRole('button', { name: 'Save draft' }).click()
      await page.getByTestId('quote-send').waitFor()
      quoteNumber = (await page.getByTestId('quote-number').textContent())!.replace('Quote ', '').trim()
      quoteId = Number(new URL(page.url()).pathname.split('/').pop())
      await expect(page.getByTestId('quote-status').textContent()).resolves.toBe('Draft')
      await page.getByTestId('quote-send').click()
      await page.getByText('The quote with its PDF was e-mailed to').waitFor()
      await expect(page.getByTestId('quote-status').textContent()).resolves.toBe('Sent')
      await screenshot(page, 'quotes-desktop-fabricator-sent')
      expect(one<{ n: number }>('select count(*) n from outbox where kind = \'quote\' and subject like ?', `%${quoteNumber}%`).n).toBe(1)

      await page.getByRole('link', { name: 'Quotes', exact: true }).click()
      await page.getByTestId('quote-list').getByRole('link', { name: quoteNumber }).waitFor()
      await screenshot(page, 'quotes-desktop-list')
    }
    finally {
      await browser.close()
    }
  })

  it('the driver, on a phone, opens it from the car page, accepts it and pays the deposit', async () => {
    expect(quoteId).toBeGreaterThan(0)
    const browser = await openBrowser(PHONE)
    try {
      const { page } = browser
      await signInThroughPage(page, 'driver@kestrel.test')
      await page.getByTestId('home-driver').waitFor()
      await page.getByTestId('vehicle-list').getByRole('link').first().click()
      await page.getByTestId('vehicle-quotes').waitFor()
      await page.getByTestId('vehicle-quotes').getByRole('link', { name: quoteNumber }).click()
      await page.getByTestId('quote-answer').waitFor()
      await expect(page.getByTestId('fabrication-cautions').isVisible()).resolves.toBe(true)
      // Nothing sticks out sideways on a phone.
      await expect(page.evaluate(() => document.documentElement.scrollWidth)).resolves.toBeLessThanOrEqual(PHONE.width)
      await screenshot(page, 'quotes-phone-driver-open')

      await page.getByRole('button', { name: 'Accept the quote' }).click()
      await page.getByTestId('quote-pay').waitFor()
      await expect(page.getByTestId('quote-status').textContent()).resolves.toBe('Accepted')
      await page.getByTestId('quote-pay').click()
      await page.waitForURL(/\/pay\/cs_local_/)
      await expect(page.getByTestId('checkout-amount').textContent()).resolves.toMatch(/€/)
      await screenshot(page, 'quotes-phone-driver-checkout')
      await page.getByRole('button', { name: /^Pay / }).click()

      await page.waitForURL(new RegExp(`/quotes/${quoteId}\\?payment=done`))
      await page.getByTestId('quote-paid-notice').waitFor()
      await expect(page.getByTestId('quote-status').textContent()).resolves.toBe('Deposit paid')
      await expect(page.getByTestId('quote-paid').textContent()).resolves.toMatch(/paid on/)
      await screenshot(page, 'quotes-phone-driver-paid')
      expect(one<{ status: string }>('select status from quotes where id = ?', quoteId).status).toBe('deposit_paid')
    }
    finally {
      await browser.close()
    }
  })
})
