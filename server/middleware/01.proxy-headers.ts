// X-Forwarded-* and Forwarded say where a request came from only when a proxy we run wrote them.
// Unless NUXT_TRUST_PROXY is set, drop them before anything reads them: the client address for the
// sign-in limits, the host and scheme in error replies and links, the origin check.
const FORWARDED = ['forwarded', 'x-forwarded-for', 'x-forwarded-host', 'x-forwarded-proto', 'x-forwarded-port', 'x-forwarded-prefix', 'x-real-ip']

export default defineEventHandler((event) => {
  if (trustsProxy()) return
  const headers = event.node.req.headers
  for (const name of FORWARDED) Reflect.deleteProperty(headers, name)
})
