// The heavy part of a log upload, run in a worker thread (piscina) so the server's event loop
// keeps answering other people while a large file is parsed and analysed. Bundled on its own by
// modules/analysis-worker.ts; it talks to the engine only through its public entry.
import {
  analyseLog,
  importLog,
  isLogImportError,
  type AnalyseOptions,
  type AnalysisResult,
  type LogImportErrorDetails,
  type ImportOptions,
  type ImportedLog,
  type LogImportErrorCode,
} from '../analysis'
import { move, transferableSymbol, valueSymbol } from 'piscina'

/** A file on this machine's disk (read by the worker itself), or a stored file's bytes (copied in). */
export type JobSource = { path: string } | Uint8Array

export type AnalysisJob
  = | { kind: 'analyse', source: JobSource, importOptions: ImportOptions, analyseOptions: AnalyseOptions }
    | { kind: 'import', source: JobSource, importOptions: ImportOptions }

export interface AnalysedLog {
  analysis: AnalysisResult
  mapping: ImportedLog['mapping']
  rowCount: number
  durationS: number
}

/** An engine error crosses the thread boundary as data (an Error loses its fields on the way). */
export interface EngineFailure {
  code: LogImportErrorCode
  message: string
  details: { column?: string, line?: number, channel?: string, drives?: LogImportErrorDetails['drives'] }
}

export type JobReply
  = | { ok: true, kind: 'analyse', value: AnalysedLog }
    | { ok: true, kind: 'import', value: ImportedLog }
    | { ok: false, failure: EngineFailure }

// piscina moves the listed buffers to the main thread instead of copying them (the channels of a
// 1 M-row log are tens of MB). piscina stays outside the bundle: `move` must be the very copy the
// worker thread's piscina runtime checks against.
function movable(reply: Extract<JobReply, { kind: 'import' }>) {
  const buffers = new Set<ArrayBuffer>()
  for (const array of Object.values(reply.value.channels)) {
    if (ArrayBuffer.isView(array) && array.buffer instanceof ArrayBuffer && array.byteLength === array.buffer.byteLength) buffers.add(array.buffer)
  }
  return move({ [transferableSymbol]: [...buffers], [valueSymbol]: reply } as unknown as Parameters<typeof move>[0]) as unknown as JobReply
}

export default async function run(job: AnalysisJob) {
  try {
    const imported = await importLog(job.source, job.importOptions)
    if (job.kind === 'import') return movable({ ok: true, kind: 'import', value: imported })
    const analysis = analyseLog(imported, job.analyseOptions)
    return { ok: true, kind: 'analyse', value: { analysis, mapping: imported.mapping, rowCount: imported.rowCount, durationS: imported.durationS } } satisfies JobReply
  }
  catch (error) {
    if (!isLogImportError(error)) throw error
    return { ok: false, failure: { code: error.code, message: error.message, details: { column: error.column, line: error.line, channel: error.channel, drives: error.drives } } } satisfies JobReply
  }
}
