import { request } from 'node:http'

// A multipart upload written to the socket piece by piece, as a misbehaving or slow client would:
// without Content-Length (chunked), or with a Content-Length that does not match the body.
// It stops writing as soon as the server answers, and reports how much it had sent by then.

export interface StreamedUploadOptions {
  baseUrl: string
  cookie: string
  fields: Record<string, string | number>
  fileName: string
  /** Size of the file part in bytes; its content is repeated log lines (or the first bytes of `fileRows`). */
  fileBytes: number
  /** Data rows to send instead of the one repeated line (under the same header). */
  fileRows?: Buffer
  /** Send this Content-Length instead of chunked transfer (a lie when it does not match), or the true one. */
  contentLength?: number | 'true'
}

export interface StreamedUploadResult {
  status: number
  body: string
  /** File bytes written before the answer came (or the connection closed). */
  sentBeforeAnswer: number
  answeredAfterMs: number
  retryAfter?: string
  error?: string
}

const LINE = '12.35,4100,100.0,212.5,61.2,139.8,31.0,98.4\n'

export function streamUpload(options: StreamedUploadOptions): Promise<StreamedUploadResult> {
  const boundary = `----densitas-test-${Math.random().toString(16).slice(2)}`
  let head = ''
  for (const [name, value] of Object.entries(options.fields)) {
    head += `--${boundary}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`
  }
  head += `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${options.fileName}"\r\nContent-Type: text/csv\r\n\r\nTime (s),Engine speed (rpm),Pedal (%),Manifold pressure abs (kPa),Charge air temp (°C),Pre-cooler temp (°C),Ambient temp (°C),Road speed (km/h)\n`
  const tail = `\r\n--${boundary}--\r\n`
  const chunk = Buffer.from(LINE.repeat(Math.ceil((1 << 20) / LINE.length)).slice(0, 1 << 20))
  const pieceAt = (offset: number, length: number) => options.fileRows
    ? options.fileRows.subarray(offset, offset + length)
    : length >= chunk.length ? chunk : chunk.subarray(0, length)
  const url = new URL('/api/logs', options.baseUrl)
  const headers: Record<string, string | number> = {
    'content-type': `multipart/form-data; boundary=${boundary}`,
    'cookie': options.cookie,
    'origin': options.baseUrl,
    'x-forwarded-for': '198.51.100.77',
  }
  if (options.contentLength === 'true') headers['content-length'] = Buffer.byteLength(head) + options.fileBytes + Buffer.byteLength(tail)
  else if (options.contentLength !== undefined) headers['content-length'] = options.contentLength

  const started = performance.now()
  return new Promise((resolve) => {
    let sent = 0
    let answered = false
    let settled = false
    const finish = (result: Omit<StreamedUploadResult, 'sentBeforeAnswer' | 'answeredAfterMs'>, at: number) => {
      if (settled) return
      settled = true
      resolve({ ...result, sentBeforeAnswer: at, answeredAfterMs: Math.round(performance.now() - started) })
      req.destroy()
    }
    // A connection of its own: one the server closed after an earlier answer is no use.
    const req = request(url, { method: 'POST', headers, agent: false })
    req.on('response', (response) => {
      answered = true
      const at = sent
      let body = ''
      response.setEncoding('utf8')
      response.on('data', (text: string) => {
        body += text
      })
      const retryAfter = response.headers['retry-after'] as string | undefined
      response.on('end', () => finish({ status: response.statusCode ?? 0, body, retryAfter }, at))
      response.on('error', () => finish({ status: response.statusCode ?? 0, body }, at))
    })
    req.on('error', error => finish({ status: 0, body: '', error: error.message }, sent))
    const pump = async () => {
      req.write(head)
      while (!answered && !settled && sent < options.fileBytes) {
        const piece = pieceAt(sent, Math.min(chunk.length, options.fileBytes - sent))
        sent += piece.length
        if (!req.write(piece)) {
          await new Promise<void>((done) => {
            const go = () => {
              req.off('drain', go)
              req.off('close', go)
              done()
            }
            req.once('drain', go)
            req.once('close', go)
          })
        }
      }
      if (!answered && !settled) req.end(tail)
    }
    pump().catch(error => finish({ status: 0, body: '', error: String(error) }, sent))
  })
}
