// Memory check for the JSON body limit: starts the built server, sends 150 MB JSON bodies to the
// password-reset request (with Content-Length, then chunked), and prints the server's resident
// memory before and after with the answer and its time. Run: npx tsx scripts/body-limit.ts
// (after npm run build).
import { readFileSync } from 'node:fs'
import { request } from 'node:http'
import { startServer } from '../tests/setup/server'

const TOTAL = 150 * 1024 * 1024

function rssMb(pid: number) {
  const match = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))
  return match ? Math.round(Number(match[1]) / 1024) : Number.NaN
}

function send(baseUrl: string, chunked: boolean) {
  return new Promise<{ status: number, ms: number, sentMb: number }>((resolve, reject) => {
    const started = performance.now()
    const req = request(new URL('/api/auth/reset-request', baseUrl), {
      method: 'POST',
      headers: { 'content-type': 'application/json', ...(chunked ? {} : { 'content-length': String(TOTAL) }) },
    })
    const chunk = Buffer.alloc(256 * 1024, 0x61)
    let sent = 0
    let answered = false
    const pump = () => {
      while (!answered && sent < TOTAL) {
        sent += chunk.length
        if (!req.write(chunk)) return req.once('drain', pump)
      }
      if (!answered) req.end()
    }
    req.on('response', (response) => {
      answered = true
      response.resume()
      response.on('end', () => resolve({ status: response.statusCode ?? 0, ms: Math.round(performance.now() - started), sentMb: Math.round(sent / 1024 / 1024) }))
    })
    req.on('error', error => answered ? undefined : reject(error))
    pump()
  })
}

const server = await startServer('body-limit', { NUXT_SEED_DEMO: 'false' })
try {
  const pid = server.pid
  console.log(`server RSS at rest: ${rssMb(pid)} MB`)
  for (const chunked of [false, true]) {
    const reply = await send(server.baseUrl, chunked)
    await new Promise(resolve => setTimeout(resolve, 500))
    console.log(`150 MB JSON ${chunked ? 'chunked, no Content-Length' : 'with Content-Length'}: ${reply.status} after ${reply.ms} ms, ${reply.sentMb} MB sent before the answer; server RSS now ${rssMb(pid)} MB`)
  }
}
finally {
  await server.stop()
}
