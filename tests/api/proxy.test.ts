import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startServer, type RunningServer } from '../setup/server'

// Without NUXT_TRUST_PROXY (the default), forwarded headers are a client's claim and are ignored.
describe('a server not behind a configured proxy', () => {
  let server: RunningServer
  beforeAll(async () => {
    server = await startServer('no-proxy', { NUXT_TRUST_PROXY: 'false' })
  })
  afterAll(async () => {
    await server.stop()
  })

  it('does not echo a forwarded host in an error reply', async () => {
    const headers = { 'x-forwarded-host': 'evil.example', 'x-forwarded-proto': 'https' }
    for (const path of ['/api/vehicles/1', `/api/shared/${'x'.repeat(30)}`, '/no-such-page']) {
      const response = await fetch(`${server.baseUrl}${path}`, { headers, redirect: 'manual' })
      expect(response.status, path).toBeGreaterThanOrEqual(300)
      expect(await response.text(), path).not.toContain('evil.example')
      expect(response.headers.get('location') ?? '', path).not.toContain('evil.example')
    }
  })

  it('counts failed sign-ins by the connection, whatever X-Forwarded-For claims', async () => {
    const email = 'driver@kestrel.test'
    for (let attempt = 0; attempt < 5; attempt++) {
      const response = await fetch(`${server.baseUrl}/api/auth/login`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'x-forwarded-for': `192.0.2.${attempt + 1}` },
        body: JSON.stringify({ email, password: `wrong-${attempt}` }),
      })
      expect(response.status).toBe(401)
    }
    const next = await fetch(`${server.baseUrl}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-forwarded-for': '192.0.2.77' },
      body: JSON.stringify({ email, password: 'densitas-demo' }),
    })
    expect(next.status).toBe(429)
  })

  it('takes the request\'s own address as its origin, not a forwarded one', async () => {
    const response = await fetch(`${server.baseUrl}/api/auth/logout`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'origin': 'https://evil.example', 'x-forwarded-host': 'evil.example', 'x-forwarded-proto': 'https' },
      body: '{}',
    })
    expect(response.status).toBe(403)
    const own = await fetch(`${server.baseUrl}/api/auth/logout`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'origin': server.baseUrl },
      body: '{}',
    })
    expect(own.status).toBe(200)
  })
})
