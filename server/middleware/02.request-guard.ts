import type { H3Event } from 'h3'

// Before any route runs, for requests that change something (POST, PUT, PATCH, DELETE):
//  1. refuse those sent by another website (403), see crossSiteProblem;
//  2. on /api, accept JSON bodies only, except the multipart upload routes and the routes that
//     take raw bytes (415);
//  3. read a JSON body within one size limit, and a bytes body within its route's limit,
//     whatever Content-Length says (413).
// Payment webhooks are left to their own route: signed, server to server, raw bytes.
export default defineEventHandler(async (event) => {
  if (!UNSAFE_METHODS.has(event.method)) return
  const path = event.path.split('?')[0]!
  if (isWebhookPath(path)) return

  const problem = crossSiteProblem(event)
  if (problem) throw createError({ statusCode: 403, message: problem })

  if (!path.startsWith('/api/') || !hasBody(event)) return
  const contentType = getRequestHeader(event, 'content-type')
  const multipart = MULTIPART_ROUTES.some(route => route.method === event.method && route.path === path)
  if (multipart && contentType?.toLowerCase().startsWith('multipart/form-data')) return
  const bytesRoute = BYTES_ROUTES.find(route => route.method === event.method && route.path === path)
  if (bytesRoute) {
    if (!isOctetStream(contentType)) {
      throw createError({ statusCode: 415, message: 'Send the start of the log file as bytes (Content-Type: application/octet-stream), as the upload page does.' })
    }
    keepBody(event, await readLimitedBody(event, bytesRoute.limitBytes, bytesRoute.tooLargeMessage))
    return
  }
  if (!isJsonContentType(contentType)) {
    throw createError({
      statusCode: 415,
      message: multipart
        ? 'Send the log as a file upload (multipart/form-data), as the upload page does.'
        : 'Send the request body as JSON (Content-Type: application/json).',
    })
  }
  keepBody(event, await readLimitedBody(event))
})

// h3's readBody and readRawBody take a body already read from req.rawBody, so routes read this copy.
function keepBody(event: H3Event, body: Buffer) {
  ;(event.node.req as typeof event.node.req & { rawBody?: Buffer }).rawBody = body
}
