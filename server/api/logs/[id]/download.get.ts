export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { log } = findVisibleLog(actor, id)
  const file = await storedLogStream(log.id)
  if (!file) notFound('Log file')
  setResponseHeaders(event, {
    'content-type': 'text/csv; charset=utf-8',
    'content-length': log.sizeBytes,
    'content-disposition': contentDisposition(log.originalName),
    'x-content-type-options': 'nosniff',
  })
  return file instanceof Uint8Array ? send(event, file) : sendStream(event, file)
})
