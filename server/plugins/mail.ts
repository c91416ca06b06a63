import { createTransport } from 'nodemailer'

// E-mail delivery, wired at start-up (after the database plugin has migrated the schema): with no
// SMTP_URL, start the local mail sink and deliver to it; with one, deliver to that server. The
// loop then sends whatever is queued, including what an earlier run left behind.

// Each below the outbox's claim window (MAIL_CLAIM_MS), so a hung server counts as a failed try.
const TIMEOUTS = { connectionTimeout: 15_000, greetingTimeout: 15_000, socketTimeout: 60_000 }

export default defineNitroPlugin((nitroApp) => {
  const settings = mailSettings()
  const started = (async () => {
    if (settings.smtpUrl) {
      startMailDelivery(createTransport({ url: settings.smtpUrl, ...TIMEOUTS }), settings)
      return undefined
    }
    const sink = await startMailSink((mail) => {
      if (!mail.messageId || !recordArrivedMail(useDb(), mail.messageId, arrivedAttachments(mail))) {
        console.warn(`Local mail sink: received "${mail.subject ?? ''}", which is not in the outbox.`)
      }
    })
    // ignoreTLS: the sink offers no STARTTLS, and nodemailer must not try to upgrade.
    startMailDelivery(createTransport({ host: '127.0.0.1', port: sink.port, secure: false, ignoreTLS: true, ...TIMEOUTS }), settings)
    console.info(`E-mail: no SMTP_URL set, so messages go to the local mail sink on 127.0.0.1:${sink.port}; the owner's outbox page shows them.`)
    return sink
  })()
  started.catch(error => console.error('E-mail delivery did not start; messages stay queued in the outbox.', error))

  nitroApp.hooks.hook('close', async () => {
    const sink = await started.catch(() => undefined)
    await stopMailDelivery()
    await sink?.close()
    // The database plugin's close hook ran first (plugins run in file order); a send that was in
    // flight has just reopened the connection to record its result, so close it again.
    closeDatabase()
  })
})
