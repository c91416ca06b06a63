import { mkdirSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { chromium, type BrowserContext, type Page } from 'playwright-core'
import { inject } from 'vitest'

// Debian's Chromium, driven by playwright-core; no browser download.
const EXECUTABLE = process.env.CHROMIUM_PATH || '/usr/bin/chromium'
export const ARTIFACTS = resolve(import.meta.dirname, '..', 'artifacts', 'screenshots')

export const PHONE = { width: 390, height: 844 }
export const DESKTOP = { width: 1280, height: 900 }

export interface Session {
  context: BrowserContext
  page: Page
  close: () => Promise<void>
}

export async function openBrowser(viewport = DESKTOP): Promise<Session> {
  const profile = mkdtempSync(join(tmpdir(), 'densitas-chromium-'))
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: EXECUTABLE,
    headless: true,
    viewport,
    baseURL: inject('baseUrl'),
    reducedMotion: 'reduce',
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  })
  const page = context.pages()[0] ?? await context.newPage()
  return {
    context,
    page,
    close: async () => {
      await context.close()
      rmSync(profile, { recursive: true, force: true })
    },
  }
}

export async function screenshot(page: Page, name: string) {
  mkdirSync(ARTIFACTS, { recursive: true })
  const path = join(ARTIFACTS, `${name}.png`)
  await page.screenshot({ path, fullPage: true })
  return path
}

export async function signInThroughPage(page: Page, email: string, password = 'densitas-demo') {
  await page.goto('/login')
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
}
