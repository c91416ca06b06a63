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

describe('the fabricator sizes a front-mount for the demo car', () => {
  it('picks the factory-core log, sizes three cores and sees them ranked with the cautions', async () => {
    const browser = await openBrowser(DESKTOP)
    try {
      const { page } = browser
      await signInThroughPage(page, 'fab@kestrel.test')
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Cars' }).click()
      await page.getByRole('link', { name: '2.0 L four-cylinder turbo-diesel hatchback' }).click()
      await page.getByTestId('size-front-mount').click()
      await page.getByTestId('sizing-form').waitFor()

      // The log made with the factory core is offered first; the ticked cores are the larger ones.
      expect(await page.getByTestId('sizing-log').locator('option:checked').textContent()).toMatch(/stock-core/)
      const boxes = page.locator('[data-testid^="candidate-"]')
      const checked: string[] = []
      for (let i = 0; i < await boxes.count(); i++) {
        if (await boxes.nth(i).isChecked()) checked.push((await boxes.nth(i).getAttribute('data-testid'))!)
      }
      expect(checked.length).toBeGreaterThanOrEqual(4)
      // Keep three: untick the rest.
      for (const id of checked.slice(3)) await page.getByTestId(id).uncheck()

      await page.getByLabel('Ambient temperature (°C)').fill('35')
      await page.getByTestId('sizing-run').click()
      await page.getByTestId('sizing-table').waitFor()
      const rows = page.getByTestId('sizing-row')
      expect(await rows.count()).toBe(3)
      expect((await rows.first().locator('td').first().textContent())?.trim()).toBe('1')
      expect(await rows.first().textContent()).toMatch(/Best:/)
      await expect(page.getByTestId('sizing-cautions').textContent()).resolves.toMatch(/Pressure-test the charge system/)
      expect(await page.getByTestId('sizing-calibration').textContent()).toMatch(/Factory side-mount core \(small\)/)
      const quote = await page.locator('[data-testid^="quote-core-"]').first().getAttribute('href')
      expect(quote).toMatch(/^\/quotes\/new\?vehicleId=\d+&sizingId=\d+&coreId=\d+$/)
      await screenshot(page, 'sizing-fabricator')
    }
    finally {
      await browser.close()
    }
  })

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
      await screenshot(page, 'sizing-phone')
    }
    finally {
      await browser.close()
    }
  })
})
