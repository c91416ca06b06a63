import { and, eq } from 'drizzle-orm'
import type { AnalysisResult, MappingInput, PullEdits } from '../analysis'

// A stored analysis written by an older engine is not read with a cast to today's result type:
// its log is analysed again from the stored file, with the stored mapping, conditions and pull
// edits, and the fresh result is stored back. Lazily, on first read, so a new release starts at
// once and only logs someone opens pay for it.

// Concurrent reads of one stale log share one re-analysis.
const running = new Map<number, Promise<AnalysisResult>>()

export function reanalyseStale(logId: number, staleVersion: string): Promise<AnalysisResult> {
  let job = running.get(logId)
  if (!job) {
    job = reanalyse(logId, staleVersion).finally(() => running.delete(logId))
    running.set(logId, job)
  }
  return job
}

async function reanalyse(logId: number, staleVersion: string): Promise<AnalysisResult> {
  const row = useDb().select({ log: tables.logs, vehicle: tables.vehicles })
    .from(tables.logs)
    .innerJoin(tables.vehicles, eq(tables.vehicles.id, tables.logs.vehicleId))
    .where(eq(tables.logs.id, logId))
    .get()
  if (!row) notFound('Log')
  const { log, vehicle } = row
  const source = await storedLogSource(log.id)
  if (!source) {
    throw createError({ statusCode: 409, message: 'This log was analysed by an older version of Densitas and its file is no longer stored, so it cannot be analysed again. Upload the log again.' })
  }
  const { analysis } = await importAndAnalyse(source, log.mapping as MappingInput, log.conditions, vehicle, log.pullEdits as PullEdits)
  useDb().transaction((tx) => {
    // Only over the stale row: an edit that re-analysed the log meanwhile keeps its newer result.
    const updated = tx.update(tables.analyses)
      .set({ result: analysis as unknown as Record<string, unknown>, engineVersion: ENGINE_VERSION, createdAt: new Date() })
      .where(and(eq(tables.analyses.logId, log.id), eq(tables.analyses.engineVersion, staleVersion)))
      .run()
    if (updated.changes > 0) {
      recordAudit(tx, { workshopId: log.workshopId, userId: null, action: 'reanalysed', entity: 'log', entityId: log.id, detail: { reason: 'engine version', from: staleVersion, to: ENGINE_VERSION } })
    }
  })
  return analysis
}
