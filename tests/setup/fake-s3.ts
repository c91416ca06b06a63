import { createServer, type IncomingMessage, type ServerResponse } from 'node:http'
import type { AddressInfo } from 'node:net'
import { AwsV4Signer } from 'aws4fetch'

// A small S3-compatible object store for tests, on 127.0.0.1 at a free port. It answers what
// unstorage's s3 driver sends (node_modules/unstorage/drivers/s3.mjs), path-style, one bucket:
//   PUT/GET/HEAD/DELETE /<bucket>/<key>, GET /<bucket> (list), POST /<bucket>?delete (bulk delete).
// Objects are kept in a Map by key. Every request must carry an AWS Signature Version 4
// Authorization header for the one access key it knows, and the signature is checked: the request
// is signed again here with that key's secret (by aws4fetch's own signer, over the headers the
// request says it signed) and must come out the same, or it is refused 403 as S3 does.
// Not checked: the clock skew, and the payload hash (the driver sends UNSIGNED-PAYLOAD).

export interface FakeS3 {
  /** The endpoint to give the driver, e.g. http://127.0.0.1:40123 */
  endpoint: string
  bucket: string
  region: string
  /** The one key it accepts; a test may change it, as when a key is rotated at the provider. */
  accessKeyId: string
  secretAccessKey: string
  /** The stored objects by key (e.g. logs/12). */
  objects: Map<string, Buffer>
  /** Every request seen, in order, with the answer given. */
  requests: { method: string, path: string, status: number }[]
  stop: () => Promise<void>
}

const xmlError = (code: string, message: string) => `<?xml version="1.0" encoding="UTF-8"?>\n<Error><Code>${code}</Code><Message>${message}</Message></Error>`
const escapeXml = (text: string) => text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;')

async function readAll(request: IncomingMessage): Promise<Buffer> {
  const chunks: Buffer[] = []
  for await (const chunk of request) chunks.push(chunk as Buffer)
  return Buffer.concat(chunks)
}

export async function startFakeS3(credentials: { bucket?: string, region?: string, accessKeyId?: string, secretAccessKey?: string } = {}): Promise<FakeS3> {
  const bucket = credentials.bucket ?? 'workshop-logs'
  const region = credentials.region ?? 'eu-central-1'
  const objects = new Map<string, Buffer>()
  const requests: FakeS3['requests'] = []
  const fake: FakeS3 = {
    endpoint: '',
    bucket,
    region,
    accessKeyId: credentials.accessKeyId ?? 'AKIDTESTONLY0000',
    secretAccessKey: credentials.secretAccessKey ?? 'test-only-secret-0123456789',
    objects,
    requests,
    stop: async () => {},
  }

  /** Why the request is refused, or null when it is signed by the known key. */
  async function refusal(request: IncomingMessage): Promise<{ code: string, message: string } | null> {
    const authorization = request.headers.authorization ?? ''
    const match = /^AWS4-HMAC-SHA256 Credential=([^/]+)\/(\d{8})\/([^/]+)\/s3\/aws4_request, SignedHeaders=([a-z0-9;-]+), Signature=([0-9a-f]{64})$/.exec(authorization)
    if (!match) return { code: 'AccessDenied', message: 'No AWS Signature Version 4 Authorization header.' }
    const [, keyId, , scopeRegion, signedHeaders, signature] = match
    if (keyId !== fake.accessKeyId) return { code: 'InvalidAccessKeyId', message: 'The access key id does not exist in our records.' }
    if (scopeRegion !== region) return { code: 'AuthorizationHeaderMalformed', message: `The region "${scopeRegion}" is wrong; expecting "${region}".` }
    const datetime = String(request.headers['x-amz-date'] ?? '')
    const headers = new Headers()
    for (const name of signedHeaders!.split(';')) {
      if (name !== 'host') headers.set(name, String(request.headers[name] ?? ''))
    }
    const again = new AwsV4Signer({
      method: request.method,
      url: `http://${request.headers.host}${request.url}`,
      headers,
      accessKeyId: fake.accessKeyId,
      secretAccessKey: fake.secretAccessKey,
      service: 's3',
      region,
      datetime,
    })
    if (again.signedHeaders !== signedHeaders || await again.signature() !== signature) {
      return { code: 'SignatureDoesNotMatch', message: 'The request signature we calculated does not match the signature you provided.' }
    }
    return null
  }

  async function handle(request: IncomingMessage, response: ServerResponse) {
    const url = new URL(request.url ?? '/', 'http://fake-s3')
    const [, first = '', ...rest] = url.pathname.split('/')
    const key = rest.map(decodeURIComponent).join('/')
    const method = request.method ?? 'GET'
    const body = await readAll(request)
    const answer = (status: number, content: string | Buffer = '', headers: Record<string, string> = {}) => {
      requests.push({ method, path: `${url.pathname}${url.search}`, status })
      response.writeHead(status, { ...(typeof content === 'string' && content ? { 'content-type': 'application/xml' } : {}), ...headers })
      response.end(method === 'HEAD' ? undefined : content)
    }

    const refused = await refusal(request)
    if (refused) return answer(403, xmlError(refused.code, refused.message))
    if (decodeURIComponent(first) !== bucket) return answer(404, xmlError('NoSuchBucket', 'The specified bucket does not exist.'))

    if (!key) {
      if (method === 'GET') {
        const prefix = url.searchParams.get('prefix') ?? ''
        const contents = [...objects].filter(([name]) => name.startsWith(prefix))
          .map(([name, bytes]) => `<Contents><Key>${escapeXml(name)}</Key><Size>${bytes.length}</Size></Contents>`).join('')
        return answer(200, `<?xml version="1.0" encoding="UTF-8"?>\n<ListBucketResult><Name>${bucket}</Name><KeyCount>${objects.size}</KeyCount>${contents}</ListBucketResult>`)
      }
      if (method === 'POST' && url.searchParams.has('delete')) {
        const keys = [...body.toString('utf8').matchAll(/<Key>([\s\S]*?)<\/Key>/g)].map(([, name]) => name!.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&amp;/g, '&'))
        for (const name of keys) objects.delete(name)
        return answer(200, `<?xml version="1.0" encoding="UTF-8"?>\n<DeleteResult>${keys.map(name => `<Deleted><Key>${escapeXml(name)}</Key></Deleted>`).join('')}</DeleteResult>`)
      }
      return answer(405, xmlError('MethodNotAllowed', 'The specified method is not allowed against this resource.'))
    }

    const stored = objects.get(key)
    switch (method) {
      case 'PUT':
        objects.set(key, body)
        return answer(200, '', { etag: `"${body.length}"` })
      case 'GET':
      case 'HEAD':
        if (!stored) return answer(404, xmlError('NoSuchKey', 'The specified key does not exist.'))
        return answer(200, stored, { 'content-type': 'application/octet-stream', 'content-length': String(stored.length) })
      case 'DELETE':
        // As S3: deleting a key that is not there is not an error.
        objects.delete(key)
        return answer(204)
      default:
        return answer(405, xmlError('MethodNotAllowed', 'The specified method is not allowed against this resource.'))
    }
  }

  const server = createServer((request, response) => {
    handle(request, response).catch((error: Error) => {
      response.writeHead(500, { 'content-type': 'application/xml' })
      response.end(xmlError('InternalError', error.message))
    })
  })
  await new Promise<void>(done => server.listen(0, '127.0.0.1', done))
  const { port } = server.address() as AddressInfo
  fake.endpoint = `http://127.0.0.1:${port}`
  fake.stop = () => new Promise<void>((done) => {
    server.closeAllConnections()
    server.close(() => done())
  })
  return fake
}
