import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_COLUMNS, generateDemoLog } from '../../server/analysis'
import { DESKTOP, openBrowser, PHONE, screenshot, signInThroughPage } from './browser'

let dir: string
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'densitas-logs-e2e-'))
})
afterAll(() => {
  rmSync(dir, { recursive: true, force: true })
})

function writeLog(name: string, csv: string | Uint8Array) {
  const path = join(dir, name)
  writeFileSync(path, csv)
  return path
}

// The demo session with its temperature columns renamed to names no rule can place: the tuner
// has to say which is which.
function logWithUnclearColumns() {
  const demo = generateDemoLog('stock-core-hot-day')
  const rename: Record<string, string> = {
    'Charge air temp (°C)': 'Sensor T2 (°C)',
    'Pre-cooler temp (°C)': 'Sensor T1 (°C)',
    'Ambient temp (°C)': 'Sensor T0 (°C)',
  }
  const [header, ...rows] = demo.csv.split('\n')
  expect(header).toBe(DEMO_COLUMNS.join(','))
  return [header!.split(',').map(h => rename[h] ?? h).join(','), ...rows].join('\n')
}

describe('the driver uploads a log from a phone', () => {
  it('picks the file, sees the columns, uploads and reads the verdict', async () => {
    const browser = await openBrowser(PHONE)
    try {
      const { page } = browser
      await signInThroughPage(page, 'driver@kestrel.test')
      await page.getByTestId('home-driver').waitFor()
      await page.getByTestId('vehicle-list').getByRole('link').first().click()
      await page.getByTestId('vehicle-logs').waitFor()
      await page.getByTestId('vehicle-upload-log').click()
      await page.getByTestId('upload-page').waitFor()
      await expect(page.getByTestId('logging-cautions').isVisible()).resolves.toBe(true)

      await page.getByTestId('upload-file-input').setInputFiles(writeLog('hot-day-session.csv', generateDemoLog('stock-core-hot-day').csv))
      await page.getByTestId('mapping-form').waitFor()
      await page.getByTestId('upload-preview').waitFor()
      await expect(page.getByTestId('upload-preview').textContent()).resolves.toMatch(/Charge air temp/)
      await expect(page.getByTestId('mapping-column-chargeTemp').inputValue()).resolves.toBe('Charge air temp (°C)')
      // The demo log carries its own ambient temperature: no question about it.
      await expect(page.getByTestId('ambient-prompt').count()).resolves.toBe(0)
      await screenshot(page, 'logs-phone-driver-upload')

      await page.getByTestId('upload-submit').click()
      await page.getByTestId('log-report').waitFor({ timeout: 45_000 })
      expect(new URL(page.url()).pathname).toMatch(/^\/logs\/\d+$/)
      const verdict = page.getByTestId('verdict')
      await expect(verdict.isVisible()).resolves.toBe(true)
      await expect(verdict.getAttribute('data-level')).resolves.toMatch(/^(fair|poor)$/)
      await expect(page.getByTestId('verdict-summary').textContent()).resolves.toMatch(/Over six pulls the charge air climbed \d+\.\d K/)
      await expect(page.getByTestId('pull-row').count()).resolves.toBe(6)
      // A driver does not edit pulls or share.
      await expect(page.getByTestId('share-panel').count()).resolves.toBe(0)
      await expect(page.getByTestId('remove-pull-0').count()).resolves.toBe(0)
      await page.getByTestId('time-chart-canvas').waitFor()
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
      expect(overflow).toBeLessThanOrEqual(0)
      await screenshot(page, 'logs-phone-driver-report')
    }
    finally {
      await browser.close()
    }
  })

  it('is told plainly when the file is not a log', async () => {
    const browser = await openBrowser(PHONE)
    try {
      const { page } = browser
      await signInThroughPage(page, 'driver@kestrel.test')
      await page.getByTestId('home-driver').waitFor()
      await page.goto('/logs/new')
      await page.getByTestId('upload-file-input').setInputFiles(writeLog('photo.jpg', 'not a log'))
      await expect(page.getByTestId('upload-file-error').textContent()).resolves.toMatch(/not a text log/)
      await expect(page.getByTestId('mapping-form').count()).resolves.toBe(0)
    }
    finally {
      await browser.close()
    }
  })
})

describe('the tuner corrects a mapping and saves it as a profile', () => {
  it('maps unclear columns, saves the profile, opens the report and zooms the chart', async () => {
    const browser = await openBrowser(DESKTOP)
    try {
      const { page } = browser
      await signInThroughPage(page, 'tuner@kestrel.test')
      await page.getByTestId('home-tuner').waitFor()
      await page.getByTestId('nav-/logs').click()
      await page.getByTestId('upload-log-link').click()
      await page.getByTestId('upload-page').waitFor()
      await page.getByTestId('upload-vehicle').selectOption({ index: 1 })

      const file = writeLog('dash-logger.csv', logWithUnclearColumns())
      await page.getByTestId('upload-file-input').setInputFiles(file)
      await page.getByTestId('mapping-form').waitFor()
      await page.getByTestId('mapping-column-chargeTemp').selectOption('Sensor T2 (°C)')
      await page.getByTestId('mapping-column-preCoolerTemp').selectOption('Sensor T1 (°C)')
      await page.getByTestId('mapping-column-ambientTemp').selectOption('Sensor T0 (°C)')
      await expect(page.getByTestId('mapping-row-chargeTemp').getByTestId('confidence-badge').textContent()).resolves.toBe('Set by you')
      await expect(page.getByTestId('ambient-prompt').count()).resolves.toBe(0)
      const profileName = `Dash logger ${Date.now()}`
      await page.getByTestId('save-profile').check()
      await page.getByTestId('profile-name').fill(profileName)
      await screenshot(page, 'logs-tuner-mapping-corrected')

      await page.getByTestId('upload-submit').click()
      await page.getByTestId('upload-progress').waitFor()
      await page.getByTestId('log-report').waitFor({ timeout: 45_000 })
      await expect(page.getByTestId('pull-row').count()).resolves.toBe(6)
      await expect(page.getByTestId('summary-eff').textContent()).resolves.toMatch(/\d+ %/)

      // Zoom with the mouse wheel over the time chart: the visible window is fetched in detail.
      const chart = page.getByTestId('time-chart-canvas')
      await chart.waitFor()
      await chart.scrollIntoViewIfNeeded()
      const box = (await chart.boundingBox())!
      await page.mouse.move(box.x + box.width * 0.3, box.y + box.height * 0.5)
      for (let i = 0; i < 6; i++) await page.mouse.wheel(0, -300)
      const windowLabel = page.getByTestId('time-chart-window')
      await windowLabel.waitFor()
      await page.waitForFunction(() => /full detail/.test(document.querySelector('[data-testid="time-chart-window"]')?.textContent ?? ''), undefined, { timeout: 15_000 })
      await expect(page.getByTestId('add-pull').isVisible()).resolves.toBe(true)
      await screenshot(page, 'logs-tuner-report-zoomed')

      // Sorting by power lost puts the worst run first, and a second click the coolest (run 1).
      const firstRun = async () => (await page.getByTestId('pull-row').first().locator('td').first().textContent())?.trim()
      await page.getByTestId('sort-powerLossVsCoolestPct').click()
      expect(await firstRun()).not.toBe('1')
      await page.getByTestId('sort-powerLossVsCoolestPct').click()
      expect(await firstRun()).toBe('1')

      // Printing hides the menu and the buttons.
      await page.emulateMedia({ media: 'print' })
      await expect(page.getByRole('navigation', { name: 'Main' }).isVisible()).resolves.toBe(false)
      await expect(page.getByTestId('share-panel').isVisible()).resolves.toBe(false)
      await screenshot(page, 'logs-tuner-report-print')
      await page.emulateMedia({ media: 'screen' })

      // A run the tuner does not count: the server analyses again without it.
      page.once('dialog', dialog => dialog.accept())
      await page.getByTestId('remove-pull-0').click()
      await page.waitForFunction(() => document.querySelectorAll('[data-testid="pull-row"]').length === 5, undefined, { timeout: 15_000 })
      await expect(page.getByTestId('summary-pulls').textContent()).resolves.toMatch(/^\s*Pulls\s*5/)

      // The same logger again: the profile is offered and fills the columns.
      await page.goto('/logs/new')
      await page.getByTestId('upload-file-input').setInputFiles(file)
      await page.getByTestId('profile-offer').waitFor()
      await expect(page.getByTestId('profile-offer').textContent()).resolves.toContain(profileName)
      await page.getByTestId('profile-apply').click()
      await expect(page.getByTestId('mapping-column-chargeTemp').inputValue()).resolves.toBe('Sensor T2 (°C)')
      await expect(page.getByTestId('mapping-column-ambientTemp').inputValue()).resolves.toBe('Sensor T0 (°C)')
      await screenshot(page, 'logs-tuner-profile-offered')
    }
    finally {
      await browser.close()
    }
  })
})

describe('a log saved as UTF-16 by its logger', () => {
  it('shows clean column names in the mapping form and the preview, and uploads', async () => {
    const demo = generateDemoLog('stock-core-hot-day')
    const utf16 = new Uint8Array([0xFF, 0xFE, ...Buffer.from(demo.csv.replaceAll('\n', '\r\n'), 'utf16le')])
    const browser = await openBrowser(DESKTOP)
    try {
      const { page } = browser
      await signInThroughPage(page, 'tuner@kestrel.test')
      await page.getByTestId('home-tuner').waitFor()
      await page.goto('/logs/new')
      await page.getByTestId('upload-vehicle').selectOption({ index: 1 })
      await page.getByTestId('upload-file-input').setInputFiles(writeLog('utf16-logger.csv', utf16))
      await page.getByTestId('mapping-form').waitFor()
      await page.getByTestId('upload-preview').waitFor()
      await expect(page.getByTestId('mapping-column-chargeTemp').inputValue()).resolves.toBe('Charge air temp (°C)')
      await expect(page.getByTestId('mapping-column-ambientTemp').inputValue()).resolves.toBe('Ambient temp (°C)')
      const options = await page.getByTestId('mapping-column-chargeTemp').locator('option').allTextContents()
      expect(options.join('|')).toContain('Pre-cooler temp (°C)')
      const preview = await page.getByTestId('upload-preview').textContent()
      expect(preview).toContain('Charge air temp (°C)')
      // No stray NULs or replacement characters from reading UTF-16 as UTF-8.
      const shown = `${preview}${options.join('')}`
      expect(shown.includes('\u0000') || shown.includes('\uFFFD')).toBe(false)
      await screenshot(page, 'logs-tuner-utf16-mapping')
      await page.setViewportSize(PHONE)
      await screenshot(page, 'logs-tuner-utf16-mapping-phone')

      await page.getByTestId('upload-submit').click()
      await page.getByTestId('log-report').waitFor({ timeout: 45_000 })
      await expect(page.getByTestId('pull-row').count()).resolves.toBe(6)
    }
    finally {
      await browser.close()
    }
  })
})

// The whole real log when the shared data sits beside the checkout (as on CI); its trimmed excerpt
// in tests/fixtures/real otherwise, so the journey runs from any checkout.
function realLog(whole: string, excerpt: string) {
  const full = resolve(import.meta.dirname, '..', '..', '..', 'shared', 'data', 'real', whole)
  return existsSync(full) ? full : resolve(import.meta.dirname, '..', 'fixtures', 'real', excerpt)
}

describe('a real log without an ambient temperature, shared with the customer', () => {
  const petrol = realLog('obd-na-petrol-city-long2.csv', 'petrol-pulls-excerpt.csv')

  it('asks for the ambient temperature, analyses, and the shared link opens without sign-in', async () => {
    const tuner = await openBrowser(DESKTOP)
    const visitor = await openBrowser(PHONE)
    try {
      const { page } = tuner
      await signInThroughPage(page, 'tuner@kestrel.test')
      await page.getByTestId('home-tuner').waitFor()
      await page.goto('/logs/new')
      await page.getByTestId('upload-vehicle').selectOption({ index: 1 })
      await page.getByTestId('upload-file-input').setInputFiles(petrol)
      await page.getByTestId('ambient-prompt').waitFor()
      await page.getByTestId('upload-submit').click()
      await expect(page.getByTestId('upload-error').textContent()).resolves.toMatch(/Enter the ambient temperature/)
      await page.getByTestId('condition-ambient').fill('31')
      await page.getByTestId('upload-submit').click()
      await page.getByTestId('log-report').waitFor({ timeout: 50_000 })
      await expect(page.getByTestId('summary-peak').textContent()).resolves.toMatch(/ambient 31\.0 °C \(entered\)/)
      await expect(page.getByTestId('verdict-assumptions').textContent()).resolves.toMatch(/entered by hand/)
      await page.getByTestId('time-chart-canvas').waitFor()
      await screenshot(page, 'logs-tuner-real-petrol-report')

      await page.getByTestId('share-create').click()
      const url = await page.getByTestId('share-url').inputValue()
      expect(url).toMatch(/\/shared\/[\w-]+$/)
      await page.getByTestId('share-link').first().waitFor()

      await visitor.page.goto(new URL(url).pathname)
      await visitor.page.getByTestId('shared-report').waitFor()
      await expect(visitor.page.getByTestId('verdict').isVisible()).resolves.toBe(true)
      await expect(visitor.page.getByTestId('share-panel').count()).resolves.toBe(0)
      await expect(visitor.page.getByTestId('notes-input').count()).resolves.toBe(0)
      await visitor.page.getByTestId('time-chart-canvas').waitFor()
      await screenshot(visitor.page, 'logs-shared-report-phone')
    }
    finally {
      await tuner.close()
      await visitor.close()
    }
  })
})

describe('the real turbo-diesel log with engine stops', () => {
  const diesel = realLog('obd-turbodiesel-winter-2018-03-01.csv', 'diesel-engine-stop-excerpt.csv')

  it('uploads through the page and marks the engine-off artefacts instead of calling them heat soak', async () => {
    const browser = await openBrowser(DESKTOP)
    try {
      const { page } = browser
      await signInThroughPage(page, 'tuner@kestrel.test')
      await page.getByTestId('home-tuner').waitFor()
      await page.goto('/logs/new')
      await page.getByTestId('upload-vehicle').selectOption({ index: 1 })
      await page.getByTestId('upload-file-input').setInputFiles(diesel)
      await page.getByTestId('mapping-form').waitFor()
      // The diesel's throttle flap never reaches full: the pedal is what marks a run.
      await expect(page.getByTestId('mapping-column-pedal').inputValue()).resolves.toMatch(/Accelerator Pedal Position/)
      // The log has its own ambient temperature: no question about it.
      await expect(page.getByTestId('ambient-prompt').count()).resolves.toBe(0)
      await page.getByTestId('upload-submit').click()
      await page.getByTestId('log-report').waitFor({ timeout: 50_000 })
      const quality = page.getByTestId('report-quality')
      await quality.waitFor()
      const text = await quality.textContent()
      expect(text).toMatch(/Engine off/)
      expect(text).toMatch(/Settling after restart/)
      await page.getByTestId('time-chart-canvas').waitFor()
      await screenshot(page, 'logs-tuner-real-diesel-report')
    }
    finally {
      await browser.close()
    }
  })
})
