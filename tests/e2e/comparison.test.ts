import { describe, expect, it } from 'vitest'
import { DESKTOP, openBrowser, PHONE, screenshot, signInThroughPage } from './browser'

let sharedUrl = ''

describe('the tuner compares the core before and after', () => {
  it('builds a comparison from the car page and reads the verdict', async () => {
    const browser = await openBrowser(DESKTOP)
    try {
      const { page } = browser
      await signInThroughPage(page, 'tuner@kestrel.test')
      await page.waitForURL(url => url.pathname === '/')
      await page.goto('/vehicles')
      await page.getByRole('link', { name: /2\.0 L four-cylinder turbo-diesel hatchback/ }).first().click()
      await page.getByTestId('vehicle-comparisons').waitFor()
      const carPath = new URL(page.url()).pathname
      // The demo pair of dyno runs, corrected, with the caution beside them.
      await expect(page.getByTestId('dyno-run').count()).resolves.toBeGreaterThanOrEqual(2)
      await expect(page.getByTestId('dyno-caution').textContent()).resolves.toMatch(/trained operators/)
      await expect(page.getByTestId('dyno-comparison').textContent()).resolves.toMatch(/corrected by SAE J1349 \(2004\)/)
      await screenshot(page, 'comparison-car-page')
      await page.getByTestId('comparison-start').click()
      const builder = page.getByTestId('comparison-builder')
      await builder.waitFor()
      // The picker shows what decides the choice: day, core, ambient, pulls, mean effectiveness.
      const stockRow = builder.locator('tr', { hasText: 'demo-stock-core-mild-day.csv' })
      await expect(stockRow.textContent()).resolves.toMatch(/18 Apr 2026.*Factory side-mount core.*14\.\d °C.*6.*\d\d %/s)
      for (const select of await builder.locator('select[data-testid^="side-"]').all()) await select.selectOption('')
      await stockRow.locator('select').selectOption('before')
      await builder.locator('tr', { hasText: 'demo-front-mount-after.csv' }).locator('select').first().selectOption('after')
      await page.getByTestId('comparison-reference').fill('25')
      await page.getByTestId('comparison-build').click()

      await page.getByTestId('comparison-page').waitFor({ timeout: 30_000 })
      expect(new URL(page.url()).pathname).toMatch(/^\/comparisons\/\d+$/)
      const verdict = page.getByTestId('comparison-verdict')
      await expect(verdict.getAttribute('data-tone')).resolves.toBe('better')
      await expect(page.getByTestId('comparison-verdict-text').textContent()).resolves.toMatch(/The after core works better: effectiveness \+\d+\.\d points \(95 % interval/)
      await expect(verdict.textContent()).resolves.toMatch(/Common practice, no source/)
      // The hotter after day: the page says the raw charge temperatures mislead.
      await expect(page.getByTestId('comparison-warning-raw-misleads').textContent()).resolves.toMatch(/raw charge temperatures mislead/)
      await expect(page.getByTestId('figure-effectiveness').textContent()).resolves.toMatch(/\+\d+\.\d points/)
      await page.getByTestId('comparison-reference-chart').locator('canvas').first().waitFor()
      await page.getByTestId('comparison-delta-chart').locator('canvas').first().waitFor()
      await screenshot(page, 'comparison-desktop-tuner')

      await page.getByTestId('share-create').click()
      await page.getByTestId('share-url').waitFor()
      sharedUrl = await page.getByTestId('share-url').inputValue()
      expect(sharedUrl).toMatch(/\/shared\/[\w-]+$/)

      await page.emulateMedia({ media: 'print' })
      await expect(page.getByTestId('share-panel').isVisible()).resolves.toBe(false)
      await screenshot(page, 'comparison-print')
      await page.emulateMedia({ media: 'screen' })
      await page.goto(carPath)
      await expect(page.getByTestId('comparison-list').textContent()).resolves.toMatch(/After core works better/)
    }
    finally {
      await browser.close()
    }
  })
})

describe('the driver opens the shared comparison on a phone', () => {
  it('reads the verdict and the figures without signing in, nothing wider than the screen', async () => {
    expect(sharedUrl).not.toBe('')
    const browser = await openBrowser(PHONE)
    try {
      const { page } = browser
      await page.goto(new URL(sharedUrl).pathname)
      await page.getByTestId('shared-comparison').waitFor()
      await expect(page.getByTestId('comparison-verdict-text').textContent()).resolves.toMatch(/The after core works better/)
      await expect(page.getByTestId('comparison-warning-raw-misleads').isVisible()).resolves.toBe(true)
      await page.getByTestId('comparison-effectiveness-chart').locator('canvas').first().waitFor()
      await expect(page.getByTestId('comparison-recompute').count()).resolves.toBe(0)
      await expect(page.getByTestId('share-panel').count()).resolves.toBe(0)
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
      expect(overflow).toBeLessThanOrEqual(0)
      await screenshot(page, 'comparison-phone-shared')
    }
    finally {
      await browser.close()
    }
  })

  it('a driver signed in on a phone also finds it on their car page', async () => {
    const browser = await openBrowser(PHONE)
    try {
      const { page } = browser
      await signInThroughPage(page, 'driver@kestrel.test')
      await page.getByTestId('home-driver').waitFor()
      await page.getByTestId('vehicle-list').getByRole('link').first().click()
      await page.getByTestId('vehicle-comparisons').waitFor()
      await expect(page.getByTestId('comparison-start').count()).resolves.toBe(0)
      await page.getByTestId('comparison-list').getByRole('link').first().click()
      await page.getByTestId('comparison-page').waitFor()
      await expect(page.getByTestId('comparison-delete').count()).resolves.toBe(0)
      await expect(page.getByTestId('comparison-verdict').isVisible()).resolves.toBe(true)
    }
    finally {
      await browser.close()
    }
  })
})
