import type { H3Event } from 'h3'

// Limits every JSON body is read within, whatever the headers say.
export const JSON_BODY_LIMIT_BYTES = 1024 * 1024

// Routes that take multipart/form-data (a file) instead of JSON; they read their own stream.
export const MULTIPART_ROUTES: ReadonlyArray<{ method: string, path: string }> = [
  { method: 'POST', path: '/api/logs' },
]

// Routes that take raw bytes (application/octet-stream) instead of JSON, each read within its own
// limit and answered with its own 413 message. The upload form sends the start of a log this way
// so the server decodes it exactly as the import will (UTF-16, Windows-1252).
export interface BytesRoute {
  method: string
  path: string
  limitBytes: number
  tooLargeMessage: string
}

export const BYTES_ROUTES: ReadonlyArray<BytesRoute> = [
  {
    method: 'POST',
    path: '/api/logs/detect',
    limitBytes: LOG_UPLOAD_LIMITS.sampleBytes,
    tooLargeMessage: `Send only the first ${LOG_UPLOAD_LIMITS.sampleBytes / 1024} KB of the log for detection; the whole file goes with the upload.`,
  },
]

export function isOctetStream(value: string | undefined) {
  return value?.split(';')[0]!.trim().toLowerCase() === 'application/octet-stream'
}

// Signed server-to-server calls (payment provider): no browser, no cookie, their own checks.
export const isWebhookPath = (path: string) => path.startsWith('/api/webhooks/')

export const UNSAFE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

function originOf(url: string | undefined) {
  if (!url) return null
  try {
    return new URL(url).origin
  }
  catch {
    return null
  }
}

// The app's own origins: the one this request was addressed to (scheme and host, from a trusted
// proxy when there is one) and the configured public address.
export function ownOrigins(event: H3Event) {
  const origins = new Set<string>()
  const trusted = trustsProxy()
  const host = getRequestHost(event, { xForwardedHost: trusted })
  const protocol = getRequestProtocol(event, { xForwardedProto: trusted })
  if (host) origins.add(`${protocol}://${host}`)
  const configured = originOf(process.env.APP_URL || useRuntimeConfig().public.appUrl)
  if (configured) origins.add(configured)
  return origins
}

// A browser names the page that sent a request (Origin, Sec-Fetch-Site); a form or script on
// another site must not act with this site's cookie. Requests naming no origin at all come from
// programs, not from pages, and carry no ambient cookie risk beyond what they send themselves.
export function crossSiteProblem(event: H3Event): string | null {
  const fetchSite = getRequestHeader(event, 'sec-fetch-site')
  if (fetchSite && fetchSite !== 'same-origin' && fetchSite !== 'none') {
    return 'This request came from another website, so it was refused. Open Densitas itself and try again there.'
  }
  const origin = getRequestHeader(event, 'origin')
  if (origin !== undefined && !ownOrigins(event).has(origin)) {
    return 'This request came from another website, so it was refused. Open Densitas itself and try again there.'
  }
  return null
}

export function isJsonContentType(value: string | undefined) {
  if (!value) return false
  const type = value.split(';')[0]!.trim().toLowerCase()
  return type === 'application/json' || (type.startsWith('application/') && type.endsWith('+json'))
}

export function hasBody(event: H3Event) {
  const headers = event.node.req.headers
  return Number.parseInt(headers['content-length'] || '0', 10) > 0 || /\bchunked\b/i.test(String(headers['transfer-encoding'] ?? ''))
}

const TOO_LARGE_FORM = `The request is too large: a form sends at most ${JSON_BODY_LIMIT_BYTES / 1024 / 1024} MB. Send less text, or upload a log file on the upload page.`

// Past the limit the answer goes out at once and nothing more is kept: the bytes still arriving
// are read and dropped (closing at once would reset the connection before the client has read
// the 413). Node's request timeout ends a client that keeps sending for ever.
function refuse(event: H3Event, message: string): Promise<never> {
  event.node.req.resume()
  return Promise.reject(createError({ statusCode: 413, message }))
}

// Reads the body into memory only up to the limit, counting the bytes as they arrive (a chunked
// body has no Content-Length to trust). Past the limit the rest is not kept, and the reply is 413.
export function readLimitedBody(event: H3Event, limit = JSON_BODY_LIMIT_BYTES, tooLargeMessage = TOO_LARGE_FORM): Promise<Buffer> {
  const req = event.node.req
  const declared = Number.parseInt(req.headers['content-length'] || '', 10)
  if (Number.isFinite(declared) && declared > limit) return refuse(event, tooLargeMessage)
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    let size = 0
    const onData = (chunk: Buffer) => {
      size += chunk.length
      if (size > limit) {
        cleanup()
        chunks.length = 0
        refuse(event, tooLargeMessage).catch(reject)
        return
      }
      chunks.push(chunk)
    }
    const onEnd = () => {
      cleanup()
      resolve(Buffer.concat(chunks, size))
    }
    const onError = (error: Error) => {
      cleanup()
      reject(createError({ statusCode: 400, message: `The request body could not be read (${error.message}). Try again.` }))
    }
    const cleanup = () => {
      req.off('data', onData)
      req.off('end', onEnd)
      req.off('error', onError)
    }
    req.on('data', onData)
    req.on('end', onEnd)
    req.on('error', onError)
  })
}
