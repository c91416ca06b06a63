import { existsSync } from 'node:fs'
import { availableParallelism } from 'node:os'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { Piscina } from 'piscina'
import { LogImportError, type ImportedLog } from '../analysis'
import type { AnalysedLog, AnalysisJob, JobReply } from '../workers/analyse-log'

// Import and analysis of a log run in a pool of worker threads, so a large upload never holds
// up the event loop that answers everyone else. At most `threads` logs are analysed at once and
// `queue` more wait; beyond that the request is answered 503 at once instead of piling up files
// and memory. The counts come from runtime config (NUXT_ANALYSIS_THREADS, NUXT_ANALYSIS_QUEUE).

export const BUSY_MESSAGE = 'The workshop\'s server is busy analysing other logs; try again in a minute.'
export const BUSY_RETRY_AFTER_S = 60

let pool: Piscina | undefined
let inFlight = 0

function poolSize() {
  const config = useRuntimeConfig().analysis
  const threads = Number(config.threads) > 0 ? Math.floor(Number(config.threads)) : Math.max(1, availableParallelism() - 1)
  const queue = Math.max(0, Math.floor(Number(config.queue) || 0))
  return { threads, queue }
}

function workerPath() {
  const configured = useRuntimeConfig().analysis.workerPath
  if (configured) return configured
  // The built server's entry (.output/server/index.mjs) publishes its own URL here.
  const entryUrl = (globalThis as { _importMeta_?: { url?: string } })._importMeta_?.url
  return join(entryUrl ? dirname(fileURLToPath(entryUrl)) : process.cwd(), 'workers', 'analyse-log.cjs')
}

function usePool() {
  if (pool) return pool
  const filename = workerPath()
  if (!existsSync(filename)) throw new Error(`The analysis worker ${filename} is missing: build the server with "npm run build".`)
  const { threads } = poolSize()
  pool = new Piscina({ filename, minThreads: threads, maxThreads: threads, idleTimeout: 60_000 })
  return pool
}

export async function closeAnalysisPool() {
  const closing = pool
  pool = undefined
  await closing?.destroy()
}

/** Whether a new job would be refused now (checked before an upload's bytes are read, too). */
export function analysisQueueFull() {
  const { threads, queue } = poolSize()
  return inFlight >= threads + queue
}

/** Where a new job would stand: 0 when a thread is free, n when n jobs wait before it. */
export function analysisQueuePosition() {
  return Math.max(0, inFlight - poolSize().threads)
}

export function analysisBusy(): never {
  throw createError({ statusCode: 503, message: BUSY_MESSAGE, data: { retryAfterS: BUSY_RETRY_AFTER_S } })
}

async function runJob(job: AnalysisJob): Promise<JobReply> {
  if (analysisQueueFull()) analysisBusy()
  inFlight++
  try {
    return await usePool().run(job) as JobReply
  }
  finally {
    inFlight--
  }
}

function unwrap<T>(reply: JobReply): T {
  if (!reply.ok) throw new LogImportError(reply.failure.code, reply.failure.message, reply.failure.details)
  return reply.value as T
}

/** Import and analyse a log file in a worker; engine errors come back as LogImportError. */
export async function analyseInWorker(job: Omit<Extract<AnalysisJob, { kind: 'analyse' }>, 'kind'>): Promise<AnalysedLog> {
  return unwrap<AnalysedLog>(await runJob({ kind: 'analyse', ...job }))
}

/** Import a log file in a worker; the channel arrays are moved, not copied, to this thread. */
export async function importInWorker(job: Omit<Extract<AnalysisJob, { kind: 'import' }>, 'kind'>): Promise<ImportedLog> {
  return unwrap<ImportedLog>(await runJob({ kind: 'import', ...job }))
}
