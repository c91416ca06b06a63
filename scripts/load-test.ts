// Load test (npm run load-test): large uploads are analysed in the worker pool while people read
// reports. Starts the built server on a free loopback port with a temporary database, then
//   1. uploads four ~1 M-row (~45 MB) logs at once and, while they are analysed, reads a demo
//      report (GET /api/logs/:id and /analysis) and /api/health in a loop;
//   2. uploads ten 40 MB logs at once (the pool takes what it can queue, the rest get a 503).
// Prints latency (p50 / p97.5 / max), request counts, peak server RSS and every upload outcome.
// Bounded: fixed uploads, and the read loop stops when they are done or after 180 s.
import { readFileSync, statSync, createReadStream } from 'node:fs'
import { mkdtemp, rm } from 'node:fs/promises'
import { request } from 'node:http'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { startServer } from '../tests/setup/server'
import { writeLog } from './lib/synthetic-log'

const READ_LOOP_LIMIT_MS = 180_000
const READERS = 4

interface UploadOutcome { status: number, ms: number, retryAfter?: string, message?: string, error?: string }

function percentile(sorted: number[], p: number) {
  if (!sorted.length) return Number.NaN
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!
}

function rssMb(pid: number) {
  const match = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))
  return match ? Number(match[1]) / 1024 : 0
}

function upload(baseUrl: string, cookie: string, vehicleId: number, path: string): Promise<UploadOutcome> {
  const boundary = `----densitas-load-${Math.random().toString(16).slice(2)}`
  const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="vehicleId"\r\n\r\n${vehicleId}\r\n--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="load.csv"\r\nContent-Type: text/csv\r\n\r\n`)
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`)
  const length = head.length + statSync(path).size + tail.length
  const started = performance.now()
  return new Promise((resolve) => {
    const req = request(`${baseUrl}/api/logs`, {
      method: 'POST',
      agent: false,
      headers: { 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': length, cookie, 'origin': baseUrl },
    })
    req.on('response', (response) => {
      let body = ''
      response.setEncoding('utf8')
      response.on('data', (text: string) => {
        body += text
      })
      response.on('end', () => {
        let message: string | undefined
        try {
          message = (JSON.parse(body) as { message?: string }).message
        }
        catch {
          message = undefined
        }
        resolve({ status: response.statusCode ?? 0, ms: Math.round(performance.now() - started), retryAfter: response.headers['retry-after'] as string | undefined, message: response.statusCode === 201 ? undefined : message })
      })
    })
    req.on('error', error => resolve({ status: 0, ms: Math.round(performance.now() - started), error: error.message }))
    req.write(head)
    const file = createReadStream(path)
    file.pipe(req, { end: false })
    file.on('end', () => req.end(tail))
  })
}

async function timed(url: string, cookie: string) {
  const started = performance.now()
  const response = await fetch(url, { headers: { cookie } })
  await response.arrayBuffer()
  return { ms: performance.now() - started, ok: response.ok }
}

async function scenario(name: string, server: { baseUrl: string, pid: number }, cookie: string, vehicleId: number, reportId: number, files: string[]) {
  const reads: number[] = []
  const health: number[] = []
  let failedReads = 0
  let peakRss = rssMb(server.pid)
  const baseRss = peakRss
  const sampler = setInterval(() => {
    peakRss = Math.max(peakRss, rssMb(server.pid))
  }, 50)
  let uploadsDone = false
  const started = performance.now()
  const uploads = Promise.all(files.map(path => upload(server.baseUrl, cookie, vehicleId, path))).finally(() => {
    uploadsDone = true
  })
  const reader = async () => {
    for (let i = 0; !uploadsDone && performance.now() - started < READ_LOOP_LIMIT_MS; i++) {
      const [path, bucket] = i % 3 === 0 ? [`/api/logs/${reportId}`, reads] : i % 3 === 1 ? [`/api/logs/${reportId}/analysis`, reads] : ['/api/health', health]
      const result = await timed(`${server.baseUrl}${path}`, cookie)
      if (!result.ok) failedReads++
      bucket.push(result.ms)
    }
  }
  await Promise.all([uploads, ...Array.from({ length: READERS }, reader)])
  clearInterval(sampler)
  const outcomes = await uploads
  const line = (label: string, values: number[]) => {
    const sorted = [...values].sort((a, b) => a - b)
    return `  ${label.padEnd(28)} n=${String(sorted.length).padStart(5)}  p50 ${percentile(sorted, 50).toFixed(1).padStart(6)} ms  p97.5 ${percentile(sorted, 97.5).toFixed(1).padStart(6)} ms  max ${(sorted.at(-1) ?? Number.NaN).toFixed(1).padStart(7)} ms`
  }
  console.log(`\n${name} (${((performance.now() - started) / 1000).toFixed(1)} s)`)
  console.log(line('report reads (log + analysis)', reads))
  console.log(line('/api/health', health))
  console.log(`  failed reads: ${failedReads}`)
  console.log(`  server RSS: ${baseRss.toFixed(0)} MB before, peak ${peakRss.toFixed(0)} MB (main process; worker threads included)`)
  const counts = new Map<string, number>()
  for (const outcome of outcomes) {
    const key = outcome.status === 0 ? `dropped (${outcome.error})` : String(outcome.status)
    counts.set(key, (counts.get(key) ?? 0) + 1)
  }
  console.log(`  uploads: ${[...counts].map(([key, n]) => `${n} × ${key}`).join(', ')}`)
  outcomes.forEach((outcome, i) => console.log(`    #${i + 1}: ${outcome.status || 'no answer'} after ${(outcome.ms / 1000).toFixed(1)} s${outcome.retryAfter ? `, Retry-After ${outcome.retryAfter}` : ''}${outcome.message ? ` — ${outcome.message}` : ''}${outcome.error ? ` — ${outcome.error}` : ''}`))
}

async function main() {
  const dir = await mkdtemp(join(tmpdir(), 'densitas-load-'))
  const server = await startServer('load')
  try {
    console.log(`Densitas load test (node ${process.version}); server on ${server.baseUrl}, pid ${server.pid}`)
    console.log('Writing the logs…')
    const large = Array.from({ length: 4 }, (_, i) => join(dir, `large-${i}.csv`))
    for (const path of large) await writeLog(path, 1_000_000)
    const forty = join(dir, 'forty.csv')
    await writeLog(forty, 900_000)
    console.log(`  4 × ${(statSync(large[0]!).size / 1048576).toFixed(1)} MB, 1 × ${(statSync(forty).size / 1048576).toFixed(1)} MB (uploaded ten times)`)

    // The demo seed runs as the server starts; wait until its people can sign in.
    let cookie = ''
    for (let attempt = 0; attempt < 100 && !cookie; attempt++) {
      const login = await fetch(`${server.baseUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'origin': server.baseUrl }, body: JSON.stringify({ email: 'tuner@kestrel.test', password: 'densitas-demo' }) })
      cookie = login.ok ? login.headers.get('set-cookie')!.split(';')[0]! : ''
      if (!cookie) await new Promise(r => setTimeout(r, 200))
    }
    if (!cookie) throw new Error('could not sign in to the demo workshop')
    const logs = await (await fetch(`${server.baseUrl}/api/logs`, { headers: { cookie } })).json() as Array<{ id: number, vehicleId: number }>
    const report = logs[0]!

    await scenario('Four ~45 MB uploads at once, report reads meanwhile', server, cookie, report.vehicleId, report.id, large)
    await scenario('Ten 40 MB uploads at once, report reads meanwhile', server, cookie, report.vehicleId, report.id, Array(10).fill(forty))
    console.log('\nTarget: report reads p97.5 < 100 ms while four large uploads are analysed.')
  }
  finally {
    await server.stop()
    await rm(dir, { recursive: true, force: true })
  }
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.stack : String(error))
  process.exitCode = 1
})
