import { join } from 'node:path'
import Database from 'better-sqlite3'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { DESKTOP, openBrowser, PHONE, screenshot, signInThroughPage, type Session } from './browser'

// A quote e-mail with a PDF and one that failed, queued the way queueMail stores them (no route on
// this branch attaches a PDF yet), so the page shows every state.
function queueTestMails() {
  const db = new Database(join(inject('dataDir'), 'densitas.sqlite'))
  db.pragma('busy_timeout = 5000')
  try {
    const workshop = (db.prepare('select workshop_id id from users where email = ?').get('owner@kestrel.test') as { id: number }).id
    const insert = db.prepare(`insert into outbox (workshop_id, to_email, subject, text, kind, status, attempts, error, attachments)
      values (?, ?, ?, 'Hello from the test.', ?, ?, ?, ?, ?)`)
    const pdf = Buffer.from('%PDF-1.4\n% a quote, as far as the mail is concerned\n%%EOF\n').toString('base64')
    insert.run(workshop, 'driver@kestrel.test', 'Your quote Q-2026-0042 from Kestrel Road Performance', 'quote', 'queued', 0, null, JSON.stringify([{ filename: 'Q-2026-0042.pdf', contentType: 'application/pdf', contentBase64: pdf }]))
    insert.run(workshop, 'driver2@kestrel.test', 'Your heat-soak report from Kestrel Road Performance', 'report-share', 'failed', 5, 'connect ECONNREFUSED 127.0.0.1:2525', '[]')
  }
  finally {
    db.close()
  }
}

describe('the outbox', () => {
  let browser: Session
  beforeAll(async () => {
    queueTestMails()
    browser = await openBrowser(DESKTOP)
  })
  afterAll(async () => {
    await browser.close()
  })

  it('the owner invites someone, is told it was e-mailed, and finds it sent in the outbox', async () => {
    const { page } = browser
    await signInThroughPage(page, 'owner@kestrel.test')
    await page.getByTestId('home-owner').waitFor()
    await page.goto('/members')
    const email = `outbox-${Date.now()}@example.test`
    await page.getByLabel('E-mail').fill(email)
    await page.getByRole('button', { name: 'Send invitation' }).click()
    const note = page.getByTestId('mail-delivery')
    await note.waitFor()
    await expect(note.getAttribute('data-status')).resolves.toBe('sent')
    await expect(note.textContent()).resolves.toContain(`The invitation was e-mailed to ${email}.`)
    await expect(page.getByTestId('invite-link').isVisible()).resolves.toBe(true)
    await screenshot(page, 'owner-invite-sent')

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Outbox', exact: true }).click()
    await page.getByTestId('outbox-table').waitFor()
    await expect(page.getByTestId('outbox-sink-note').isVisible()).resolves.toBe(true)
    const invited = page.getByTestId('outbox-row').filter({ hasText: email })
    await expect(invited.getAttribute('data-status')).resolves.toBe('sent')
    await expect(invited.textContent()).resolves.toMatch(/Invitation.*Sent/)
    // The PDF e-mail is picked up by the sweep within seconds; the page looks again on its own.
    const quote = page.getByTestId('outbox-row').filter({ hasText: 'Q-2026-0042' })
    await page.waitForFunction(() => [...document.querySelectorAll('[data-testid="outbox-row"]')].some(row => row.textContent?.includes('Q-2026-0042') && row.getAttribute('data-status') === 'sent'), null, { timeout: 20_000 })
    await expect(quote.getByTestId('outbox-attachment').textContent()).resolves.toMatch(/Q-2026-0042\.pdf\s*\d+ B, arrived/)
    await expect(page.getByTestId('outbox-row').filter({ hasText: 'heat-soak report' }).getByTestId('outbox-error').textContent()).resolves.toContain('ECONNREFUSED')
    await screenshot(page, 'owner-outbox')
  })

  it('the owner tries a failed e-mail again and it goes', async () => {
    const { page } = browser
    const failed = page.getByTestId('outbox-row').filter({ hasText: 'heat-soak report' })
    await failed.getByTestId('outbox-retry').click()
    await page.getByTestId('mail-delivery').waitFor()
    await expect(page.getByTestId('mail-delivery').textContent()).resolves.toContain('“Your heat-soak report from Kestrel Road Performance” was e-mailed to driver2@kestrel.test.')
    await expect(failed.getAttribute('data-status')).resolves.toBe('sent')
    await screenshot(page, 'owner-outbox-after-retry')
  })

  it('the tuner e-mails a report link and is told it went', { timeout: 120_000 }, async () => {
    const db = new Database(join(inject('dataDir'), 'densitas.sqlite'), { readonly: true })
    const logId = (db.prepare('select l.id from logs l join vehicles v on v.id = l.vehicle_id join users u on u.id = v.owner_id where u.email = ? limit 1').get('driver@kestrel.test') as { id: number }).id
    db.close()
    const tuner = await openBrowser(DESKTOP)
    try {
      await signInThroughPage(tuner.page, 'tuner@kestrel.test')
      await tuner.page.getByTestId('home-tuner').waitFor()
      await tuner.page.goto(`/logs/${logId}`)
      await tuner.page.getByTestId('share-email').check()
      await tuner.page.getByTestId('share-create').click()
      const note = tuner.page.getByTestId('mail-delivery')
      await note.waitFor()
      await expect(note.textContent()).resolves.toContain('The report link was e-mailed to driver@kestrel.test.')
      // The tuner has no outbox, so no link to it.
      await expect(note.getByRole('link').count()).resolves.toBe(0)
      await tuner.page.getByTestId('share-panel').scrollIntoViewIfNeeded()
      await screenshot(tuner.page, 'tuner-share-emailed')
    }
    finally {
      await tuner.close()
    }
  })

  it('fits a phone', async () => {
    const phone = await openBrowser(PHONE)
    try {
      await signInThroughPage(phone.page, 'owner@kestrel.test')
      await phone.page.getByTestId('home-owner').waitFor()
      await phone.page.goto('/outbox')
      await phone.page.getByTestId('outbox-table').waitFor()
      await screenshot(phone.page, 'phone-owner-outbox')
      const overflow = await phone.page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
      expect(overflow).toBeLessThanOrEqual(0)
    }
    finally {
      await phone.close()
    }
  })
})
