// The analysis worker pool: a "busy" answer carries Retry-After, and the threads end with the server.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('error', (error, { event }) => {
    const data = (error as { data?: { retryAfterS?: number } }).data
    if (event && data?.retryAfterS) setResponseHeader(event, 'retry-after', data.retryAfterS)
  })
  nitroApp.hooks.hook('close', () => closeAnalysisPool())
})
