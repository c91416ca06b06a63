export default defineEventHandler(async (event) => {
  const { token } = readParamsWith(event, tokenParams)
  const query = readQueryWith(event, seriesQuery)
  const { log } = findSharedLog(token)
  return seriesFor(log, query)
})
