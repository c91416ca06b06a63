import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DESKTOP, openBrowser, PHONE, screenshot, signInThroughPage, type Session } from './browser'

const ROLES = [
  { email: 'owner@kestrel.test', role: 'owner', nav: ['Overview', 'Cars', 'Logs', 'Core catalogue', 'People', 'Workshop & prices', 'Outbox'] },
  { email: 'tuner@kestrel.test', role: 'tuner', nav: ['Overview', 'Cars', 'Logs'] },
  { email: 'fab@kestrel.test', role: 'fabricator', nav: ['Overview', 'Cars', 'Logs', 'Core catalogue', 'Outbox'] },
  { email: 'driver@kestrel.test', role: 'driver', nav: ['My cars'] },
  { email: 'driver2@kestrel.test', role: 'driver', nav: ['My cars'] },
  { email: 'owner@harbourside.test', role: 'owner', nav: ['Overview', 'Logs', 'People'] },
  { email: 'driver@harbourside.test', role: 'driver', nav: ['My cars'] },
] as const

describe('each demo person signs in and lands on their own home', () => {
  let browser: Session
  beforeAll(async () => {
    browser = await openBrowser(DESKTOP)
  })
  afterAll(async () => {
    await browser.close()
  })

  it.each(ROLES)('$email sees the $role home', async ({ email, role, nav }) => {
    const { page, context } = browser
    await context.clearCookies()
    await signInThroughPage(page, email)
    await page.getByTestId(`home-${role}`).waitFor()
    const menu = page.getByRole('navigation', { name: 'Main' })
    for (const label of nav) await expect(menu.getByRole('link', { name: label, exact: true }).isVisible()).resolves.toBe(true)
    if (role === 'driver') {
      await expect(menu.getByRole('link', { name: 'Cars', exact: true }).count()).resolves.toBe(0)
      await expect(menu.getByRole('link', { name: 'Logs', exact: true }).count()).resolves.toBe(0)
      await expect(page.getByTestId('logging-cautions').isVisible()).resolves.toBe(true)
    }
    await screenshot(page, `home-${email.replace(/[@.]/g, '-')}`)
  })

  it('answers an address that is not a record\'s with "no page here", not a fault', async () => {
    const { page, context } = browser
    await context.clearCookies()
    await signInThroughPage(page, 'fab@kestrel.test')
    await page.getByTestId('home-fabricator').waitFor()
    for (const path of ['/sizing/new', '/quotes/abc', '/logs/1.5', '/no-such-page']) {
      const response = await page.goto(path)
      expect(response?.status(), path).toBe(404)
      await page.getByRole('heading', { name: 'Nothing here' }).waitFor()
      await expect(page.getByText('There is no page at this address.').isVisible(), path).resolves.toBe(true)
    }
  })

  it('says plainly when the password is wrong', async () => {
    const { page, context } = browser
    await context.clearCookies()
    await signInThroughPage(page, 'tuner@kestrel.test', 'not-the-password')
    await expect(page.getByTestId('login-error').textContent()).resolves.toMatch(/do not match an account/)
  })

  it('sends a visitor without a session to the sign-in page', async () => {
    const { page, context } = browser
    await context.clearCookies()
    await page.goto('/vehicles')
    await page.getByTestId('login-form').waitFor()
    expect(new URL(page.url()).pathname).toBe('/login')
  })
})

describe('on a phone', () => {
  it('the driver opens the menu and finds their car', async () => {
    const browser = await openBrowser(PHONE)
    try {
      const { page } = browser
      await signInThroughPage(page, 'driver@kestrel.test')
      await page.getByTestId('home-driver').waitFor()
      await expect(page.getByTestId('vehicle-list').textContent()).resolves.toMatch(/turbo-diesel hatchback/)
      await page.getByTestId('menu-toggle').click()
      await expect(page.locator('#mobile-menu').getByRole('link', { name: 'My account' }).isVisible()).resolves.toBe(true)
      await screenshot(page, 'phone-driver-menu')
      // Nothing wider than the phone: no sideways scrolling.
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
      expect(overflow).toBeLessThanOrEqual(0)
    }
    finally {
      await browser.close()
    }
  })
})

describe('the owner invites a customer, who joins from the link', () => {
  it('works end to end in the browser', async () => {
    const owner = await openBrowser(DESKTOP)
    const invited = await openBrowser(PHONE)
    try {
      await signInThroughPage(owner.page, 'owner@kestrel.test')
      await owner.page.getByTestId('home-owner').waitFor()
      await owner.page.goto('/members')
      const email = `browser-${Date.now()}@example.test`
      await owner.page.getByLabel('E-mail').fill(email)
      await owner.page.getByLabel('Role', { exact: true }).selectOption('driver')
      await owner.page.getByRole('button', { name: 'Send invitation' }).click()
      const link = (await owner.page.getByTestId('invite-link').textContent())!.trim()
      await screenshot(owner.page, 'owner-people')

      await invited.page.goto(link)
      await invited.page.getByLabel('Your name').fill('Browser Customer')
      await invited.page.getByLabel('Choose a password').fill('a fine long password')
      await invited.page.getByRole('button', { name: 'Create my account' }).click()
      await invited.page.getByTestId('home-driver').waitFor()
      await expect(invited.page.getByTestId('vehicles-empty').isVisible()).resolves.toBe(true)
    }
    finally {
      await owner.close()
      await invited.close()
    }
  })
})
