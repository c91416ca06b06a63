import { describe, expect, it } from 'vitest'
import { DESKTOP, openBrowser, PHONE, screenshot, signInThroughPage } from './browser'

// The fabricator's catalogue and sizing journey in a real browser.

describe('the fabricator keeps the catalogue', () => {
  it('searches, sorts, adds a core with a price, and is told what is wrong first', async () => {
    const browser = await openBrowser(DESKTOP)
    try {
      const { page } = browser
      await signInThroughPage(page, 'fab@kestrel.test')
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Core catalogue' }).click()
      await page.getByTestId('cores-table').waitFor()
      expect(await page.getByTestId('core-row').count()).toBeGreaterThanOrEqual(5)
      await screenshot(page, 'catalogue-fabricator')

      // Sorting by face, largest first.
      await page.getByTestId('sort-faceArea').click()
      await page.waitForFunction(() => document.querySelector('[data-testid="core-row"] td')?.textContent?.includes('700'))

      await page.getByTestId('core-search').fill('compact')
      await page.waitForFunction(() => document.querySelectorAll('[data-testid="core-row"]').length === 1)

      await page.getByTestId('add-core').click()
      await page.getByLabel('Name').fill('Test-bench front-mount 620')
      await page.getByLabel('Face width (mm)').fill('620')
      await page.getByLabel('Face height (mm)').fill('280')
      await page.getByLabel('Depth (mm)').fill('70')
      await page.getByLabel('Sell price').fill('520.505')
      await page.getByTestId('core-save').click()
      await expect(page.getByText('An amount has at most two decimals (whole cents).').isVisible()).resolves.toBe(true)
      await page.getByLabel('Sell price').fill('520.50')
      await page.getByTestId('core-save').click()
      await page.getByTestId('core-title').waitFor()
      expect(await page.getByTestId('core-title').textContent()).toMatch(/Test-bench front-mount 620/)
      expect(await page.getByTestId('core-facts').textContent()).toMatch(/€520\.50/)
      expect(await page.getByTestId('core-evidence-link').getAttribute('href')).toMatch(/^\/cores\/\d+\/evidence$/)
      await screenshot(page, 'catalogue-core-page')
    }
    finally {
      await browser.close()
    }
  })

  it('reads well on a phone', async () => {
    const browser = await openBrowser(PHONE)
    try {
      const { page } = browser
      await signInThroughPage(page, 'fab@kestrel.test')
      await page.waitForURL(url => !url.pathname.startsWith('/login'))
      await page.goto('/cores')
      await page.getByTestId('cores-table').waitFor()
      await screenshot(page, 'catalogue-phone')
    }
    finally {
      await browser.close()
    }
  })
})

// Sizing three cores on a desktop, through the quote to the paid deposit, is one journey in
// tests/e2e/quotes.test.ts; here the same page on a phone.
describe('the fabricator sizes a front-mount for the demo car', () => {
  it('shows the ranking as cards on a phone', async () => {
    const browser = await openBrowser(PHONE)
    try {
      const { page } = browser
      await signInThroughPage(page, 'fab@kestrel.test')
      await page.waitForURL(url => !url.pathname.startsWith('/login'))
      await page.goto('/vehicles')
      await page.getByRole('link', { name: '2.0 L four-cylinder turbo-diesel hatchback' }).click()
      await page.getByTestId('size-front-mount').click()
      await page.getByTestId('sizing-run').click()
      await page.getByTestId('sizing-table').waitFor()
      // Each card says what was measured with its core, and nothing sticks out sideways.
      await page.locator('[data-testid^="measured-"]').first().waitFor()
      expect(await page.locator('[data-testid^="measured-"]').count()).toBe(await page.getByTestId('sizing-row').count())
      await expect(page.evaluate(() => document.documentElement.scrollWidth)).resolves.toBeLessThanOrEqual(PHONE.width)
      await screenshot(page, 'sizing-phone')
    }
    finally {
      await browser.close()
    }
  })
})
