import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startServer, type RunningServer } from '../setup/server'
import { openBrowser, PHONE, screenshot, type Session } from './browser'

// A workshop's first start in production: from the sign-in page to the owner's home.
describe('first-run setup in the browser', () => {
  let server: RunningServer
  let browser: Session
  beforeAll(async () => {
    server = await startServer('setup-e2e', { NUXT_SEED_DEMO: 'false' })
    browser = await openBrowser(PHONE)
  })
  afterAll(async () => {
    await browser?.close()
    await server?.stop()
  })

  it('leads from the sign-in page to the setup, signs the owner in, then closes', async () => {
    const { page } = browser
    await page.goto(`${server.baseUrl}/login`)
    await screenshot(page, 'setup-sign-in-link')
    await page.getByTestId('setup-open').getByRole('link', { name: 'Set up your workshop' }).click()
    await page.getByRole('heading', { name: 'Set up your workshop' }).waitFor()
    await page.getByLabel('Workshop name').fill('Fenmoor Turbo Works')
    await page.getByLabel('Currency for prices and quotes').selectOption('GBP')
    await page.getByLabel('Your name').fill('Rhea Lind')
    await page.getByLabel('E-mail').fill('rhea@fenmoor.test')
    await page.getByLabel('Choose a password').fill('first owner passphrase')
    await screenshot(page, 'setup-filled')
    await page.getByRole('button', { name: 'Create the workshop' }).click()
    await page.getByTestId('home-owner').waitFor()
    await screenshot(page, 'setup-done-owner-home')

    await page.goto(`${server.baseUrl}/setup`)
    await expect(page.getByRole('heading', { name: 'Nothing here' }).isVisible()).resolves.toBe(true)
    await browser.context.clearCookies()
    await page.goto(`${server.baseUrl}/login`)
    await page.getByRole('button', { name: 'Sign in' }).waitFor()
    await expect(page.getByTestId('setup-open').count()).resolves.toBe(0)
  })
})
