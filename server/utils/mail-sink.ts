import type { AddressInfo } from 'node:net'
import { SMTPServer } from 'smtp-server'
import { simpleParser, type ParsedMail } from 'mailparser'

// The local mail sink: a real SMTP server on loopback that accepts every message and hands it,
// parsed, to `onMessage`. With no SMTP_URL set, Densitas delivers to it, so every e-mail really
// goes through SMTP and what arrived can be shown in the outbox.

export interface MailSink {
  port: number
  close: () => Promise<void>
}

// A quote PDF is well under this; anything larger is refused by the sink as a real server would.
const MAX_MESSAGE_BYTES = 25 * 1024 * 1024

export function startMailSink(onMessage: (mail: ParsedMail) => void, port = 0): Promise<MailSink> {
  const server = new SMTPServer({
    // Loopback only and no certificate: STARTTLS is switched off here and ignored by the sender,
    // otherwise nodemailer tries to upgrade the connection and the handshake fails.
    secure: false,
    disabledCommands: ['STARTTLS', 'AUTH'],
    authOptional: true,
    logger: false,
    size: MAX_MESSAGE_BYTES,
    banner: 'Densitas local mail sink',
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((mail) => {
          if ((stream as typeof stream & { sizeExceeded?: boolean }).sizeExceeded) {
            callback(Object.assign(new Error('Message too large for the local mail sink'), { responseCode: 552 }))
            return
          }
          onMessage(mail)
          callback()
        })
        .catch((error: Error) => callback(error))
    },
  })
  return new Promise((resolve, reject) => {
    server.once('error', reject)
    server.listen(port, '127.0.0.1', () => {
      server.off('error', reject)
      // A broken client connection must not bring the app down.
      server.on('error', error => console.warn(`Local mail sink: ${error.message}`))
      resolve({
        port: (server.server.address() as AddressInfo).port,
        close: () => new Promise(done => server.close(() => done())),
      })
    })
  })
}

// The attachments as the sink received them: the size is measured on the decoded bytes.
export function arrivedAttachments(mail: ParsedMail) {
  return mail.attachments.map((attachment, index) => ({
    filename: attachment.filename ?? `attachment-${index + 1}`,
    contentType: attachment.contentType,
    size: attachment.content.byteLength,
    contentBase64: attachment.content.toString('base64'),
  }))
}
