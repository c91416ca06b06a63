import { createReadStream } from 'node:fs'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { log } = findVisibleLog(actor, id)
  setResponseHeaders(event, {
    'content-type': 'text/csv; charset=utf-8',
    'content-length': log.sizeBytes,
    'content-disposition': contentDisposition(log.originalName),
    'x-content-type-options': 'nosniff',
  })
  return sendStream(event, createReadStream(logFilePath(log.id)))
})
