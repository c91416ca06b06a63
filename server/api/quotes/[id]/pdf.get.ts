export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const quote = findVisibleQuote(actor, id)
  const { bytes, filename } = await quotePdfFor(quote)
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `attachment; filename="${filename}"`,
    'cache-control': 'private, no-store',
  })
  return bytes
})
