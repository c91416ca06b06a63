import { createHash, randomBytes } from 'node:crypto'
import { createWriteStream, mkdirSync } from 'node:fs'
import { rm } from 'node:fs/promises'
import { join } from 'node:path'
import { Transform } from 'node:stream'
import { pipeline } from 'node:stream/promises'
import busboy from 'busboy'
import type { H3Event } from 'h3'

// A multipart form read as a stream: text fields into memory (each small and counted), the one
// file part straight to a temporary file. The byte limits hold while reading, whatever the
// request headers say, so a chunked or mislabelled upload cannot grow past them in memory or on
// disk. On any problem the temporary file is removed before the error answer goes out.

export interface MultipartLimits {
  /** Largest file part, bytes. */
  fileBytes: number
  /** Largest text field, bytes. */
  fieldBytes: number
  /** Most text fields. */
  fields: number
}

export interface ReceivedFile {
  /** Name the sender gave the file (not yet cleaned). */
  name: string
  /** Temporary file holding the bytes; the caller renames or removes it. */
  path: string
  sizeBytes: number
  sha256: string
}

export interface ReceivedForm {
  fields: Record<string, string>
  file?: ReceivedFile
}

export interface ReceiveOptions {
  /** Name of the form field that carries the file. */
  fileField: string
  /** Folder for the temporary file (on the same disk as its final place, so a rename moves it). */
  directory: string
  limits: MultipartLimits
  /** The 413 message for a file over `limits.fileBytes`. */
  tooLargeMessage: string
}

class FormProblem extends Error {
  constructor(public statusCode: number, message: string) {
    super(message)
  }
}

export function temporaryUploadPath(directory: string) {
  mkdirSync(directory, { recursive: true })
  return join(directory, `.incoming-${randomBytes(8).toString('hex')}`)
}

// After an early answer (too large, busy) the rest of the body is not wanted. A client that
// declared a Content-Length can only read the answer once it has sent everything (fetch gives up
// otherwise), so a declared rest of at most `maxBytes` is read and dropped first (never stored or
// kept in memory). A body without a length, or with more left than that, is answered at once and
// the connection closed behind the answer.
const DISCARD_SLACK_BYTES = 2 * 1024 * 1024
const DISCARD_TIMEOUT_MS = 60_000

export async function dropRestOfBody(event: H3Event, maxBytes: number, alreadyRead = 0): Promise<void> {
  const request = event.node.req
  if (request.complete) return
  const declared = Number(request.headers['content-length'])
  if (Number.isFinite(declared) && declared > 0 && declared - alreadyRead <= maxBytes) {
    await new Promise<void>((resolve) => {
      const timer = setTimeout(() => {
        request.socket?.destroy()
        resolve()
      }, DISCARD_TIMEOUT_MS)
      const done = () => {
        clearTimeout(timer)
        resolve()
      }
      request.once('end', done)
      request.once('close', done)
      request.once('error', done)
      request.resume()
    })
    return
  }
  setResponseHeader(event, 'connection', 'close')
}

export async function receiveMultipart(event: H3Event, options: ReceiveOptions): Promise<ReceivedForm> {
  const request = event.node.req
  const { limits } = options
  let parser: busboy.Busboy
  try {
    parser = busboy({
      headers: request.headers,
      // Browsers send file names as UTF-8 (busboy would read them as Latin-1 otherwise).
      defParamCharset: 'utf8',
      limits: { fileSize: limits.fileBytes, fieldSize: limits.fieldBytes, fields: limits.fields, files: 1, parts: limits.fields + 1, fieldNameSize: 100, headerPairs: 20 },
    })
  }
  catch {
    badRequest('Nothing was uploaded. Send the log as multipart/form-data with a "file" field.')
  }

  const fields: Record<string, string> = {}
  let file: ReceivedFile | undefined
  let temporary: string | undefined
  let writing: Promise<void> | undefined
  let problem: FormProblem | undefined
  let received = 0
  let fileStream: NodeJS.ReadableStream & { destroy: () => void } | undefined

  const done = new Promise<void>((resolve, reject) => {
    const fail = (error: FormProblem) => {
      if (problem) return
      problem = error
      // Stop reading: the rest of the body is not wanted, whatever it is. Ending the file stream
      // lets the temporary file close so it can be removed.
      request.unpipe(parser)
      fileStream?.destroy()
      reject(problem)
    }

    parser.on('field', (name, value, info) => {
      if (info.nameTruncated) return fail(new FormProblem(400, 'The upload form has a field with an overlong name. Send the form as the upload page does.'))
      if (info.valueTruncated) return fail(new FormProblem(400, `The form field "${name}" is too long (at most ${Math.round(limits.fieldBytes / 1024)} KB). Shorten it and try again.`))
      fields[name] = value
    })

    parser.on('file', (name, stream, info) => {
      if (name !== options.fileField) {
        stream.resume()
        return fail(new FormProblem(400, `Send the log in the "${options.fileField}" field of the form.`))
      }
      const path = temporaryUploadPath(options.directory)
      temporary = path
      fileStream = stream
      const hash = createHash('sha256')
      let sizeBytes = 0
      const counter = new Transform({
        transform(chunk: Buffer, _encoding, callback) {
          sizeBytes += chunk.length
          hash.update(chunk)
          callback(null, chunk)
        },
      })
      stream.once('limit', () => fail(new FormProblem(413, options.tooLargeMessage)))
      writing = pipeline(stream, counter, createWriteStream(path)).then(() => {
        file = { name: info.filename ?? 'log.csv', path, sizeBytes, sha256: hash.digest('hex') }
      })
      writing.catch(() => fail(new FormProblem(400, 'The upload was cut off before the file ended. Send it again.')))
    })

    parser.on('filesLimit', () => fail(new FormProblem(400, 'Send one log file per upload.')))
    parser.on('fieldsLimit', () => fail(new FormProblem(400, `The upload form has too many fields (at most ${limits.fields}). Send the form as the upload page does.`)))
    parser.on('partsLimit', () => fail(new FormProblem(400, 'The upload form has too many parts. Send the form as the upload page does.')))
    parser.on('error', () => fail(new FormProblem(400, 'The upload could not be read. Send the log as multipart/form-data with a "file" field.')))
    parser.on('close', () => {
      if (problem) return
      Promise.resolve(writing).then(() => resolve(), () => undefined)
    })
    request.on('aborted', () => fail(new FormProblem(400, 'The upload was cut off before the file ended. Send it again.')))
    request.on('error', () => fail(new FormProblem(400, 'The upload was cut off before the file ended. Send it again.')))
    request.on('data', (chunk: Buffer) => {
      received += chunk.length
    })
    request.pipe(parser)
  })

  try {
    await done
    return { fields, file }
  }
  catch (error) {
    // Let the file stream close before removing what it wrote.
    await Promise.resolve(writing).catch(() => undefined)
    if (temporary) await rm(temporary, { force: true })
    await dropRestOfBody(event, DISCARD_SLACK_BYTES, received)
    if (error instanceof FormProblem) throw createError({ statusCode: error.statusCode, message: error.message })
    throw error
  }
}
