// Every rendered page gets a content security policy that names its own inline scripts by hash,
// and no "x-powered-by". The fixed headers (frames, sniffing, referrer, caching) are route rules
// in nuxt.config.ts, so static files and errors carry them too.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('render:response', (response) => {
    const headers = (response.headers ??= {}) as Record<string, string>
    delete headers['x-powered-by']
    if (import.meta.dev) return
    const type = String(headers['content-type'] ?? '')
    if (type.startsWith('text/html') && typeof response.body === 'string') {
      headers['content-security-policy'] = pagePolicy(response.body)
    }
  })
})
