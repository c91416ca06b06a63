import { and, desc, eq, inArray, type SQL } from 'drizzle-orm'
import { canSeeAllVehicles, type Actor } from '#shared/utils/abilities'
import { formatDate } from '#shared/utils/format'
import { compareCores, ComparisonInputError, type AnalysisResult, type BeforeAfterResult, type ComparisonLogInput } from '../analysis'
import type { ComparisonLogMeta } from '#shared/types/comparison'
import type { Db } from './db'

type ComparisonRow = typeof tables.comparisons.$inferSelect
type VehicleRow = typeof tables.vehicles.$inferSelect
type LogRow = typeof tables.logs.$inferSelect

/** What is stored per comparison: the engine's result plus how each log is named. */
export interface StoredComparison extends BeforeAfterResult {
  logs: ComparisonLogMeta[]
}

// A log as people know it: its day and file name (never its database id).
export function logLabel(log: Pick<LogRow, 'recordedOn' | 'createdAt' | 'originalName'>) {
  return `of ${formatDate(log.recordedOn ?? log.createdAt)} (${log.originalName})`
}

export function visibleComparisons(actor: Actor): SQL {
  const inWorkshop = eq(tables.comparisons.workshopId, actor.workshopId)
  return canSeeAllVehicles(actor) ? inWorkshop : and(inWorkshop, eq(tables.vehicles.ownerId, actor.id))!
}

export function findVisibleComparison(actor: Actor, id: number) {
  const row = useDb().select({ comparison: tables.comparisons, vehicle: tables.vehicles })
    .from(tables.comparisons)
    .innerJoin(tables.vehicles, eq(tables.vehicles.id, tables.comparisons.vehicleId))
    .where(and(eq(tables.comparisons.id, id), visibleComparisons(actor)))
    .get()
  if (!row) notFound('Comparison')
  return row
}

function coreNames(workshopId: number) {
  const rows = useDb().select({ id: tables.cores.id, name: tables.cores.name }).from(tables.cores).where(eq(tables.cores.workshopId, workshopId)).all()
  return new Map(rows.map(r => [r.id, r.name]))
}

/**
 * Read the chosen logs and run the engine. Logs the actor cannot see are a 404; a log of another
 * car, or a choice the engine cannot compare, is a 422 naming the log. Nothing is written here.
 */
export async function computeComparison(actor: Actor, vehicle: VehicleRow, sides: { before: number[], after: number[] }, referenceAmbientC: number): Promise<StoredComparison> {
  const ids = [...new Set([...sides.before, ...sides.after])]
  const rows = ids.length
    ? useDb().select().from(tables.logs).where(and(inArray(tables.logs.id, ids), eq(tables.logs.workshopId, actor.workshopId))).all()
    : []
  const byId = new Map(rows.map(r => [r.id, r]))
  for (const id of ids) {
    const log = byId.get(id)
    if (!log) notFound(`Log ${id}`)
    if (log.vehicleId !== vehicle.id) {
      throw createError({ statusCode: 422, message: `The log ${logLabel(log)} belongs to another car. A comparison sets logs of one car side by side: choose logs of ${vehicle.description}.`, data: { code: 'OTHER_CAR', logId: log.id } })
    }
  }
  const names = coreNames(actor.workshopId)
  const pullsOf = new Map<number, AnalysisResult['pulls']>()
  for (const id of ids) pullsOf.set(id, (await storedAnalysis(id)).pulls)
  const input = (list: number[]): ComparisonLogInput[] => [...new Set(list)].map((id) => {
    const log = byId.get(id)!
    return { logId: id, label: logLabel(log), pulls: pullsOf.get(id)! }
  })
  let result: BeforeAfterResult
  try {
    result = compareCores(input(sides.before), input(sides.after), { referenceAmbientC, ratedPowerKw: vehicle.ratedPowerKw })
  }
  catch (error) {
    if (error instanceof ComparisonInputError) {
      throw createError({ statusCode: 422, message: error.message, data: { code: error.code, logId: error.logId ?? null } })
    }
    throw error
  }
  const meta = (side: 'before' | 'after') => [...new Set(sides[side])].map((id) => {
    const log = byId.get(id)!
    return { id, side, label: logLabel(log), recordedOn: log.recordedOn, coreName: log.coreId ? names.get(log.coreId) ?? null : null }
  })
  return { ...result, logs: [...meta('before'), ...meta('after')] }
}

/** The comparison as staff and the car's customer read it. */
export function comparisonView(row: ComparisonRow, vehicle: VehicleRow) {
  const result = row.result as unknown as StoredComparison
  const labels = new Map(result.logs.map(l => [l.id, l.label]))
  return {
    ...result,
    pulls: result.pulls.map(p => ({ ...p, log: labels.get(p.logId) ?? '' })),
    id: row.id,
    vehicleId: row.vehicleId,
    vehicle: { id: vehicle.id, description: vehicle.description, registration: vehicle.registration, ratedPowerKw: vehicle.ratedPowerKw },
    title: row.title,
    referenceAmbientC: row.referenceAmbientC,
    computedAt: row.computedAt,
    staleAt: row.staleAt,
    stale: row.staleAt !== null,
    createdAt: row.createdAt,
  }
}

/**
 * The comparison as a shared link shows it: what the page shows and nothing else (no database
 * ids, no staff notes, no author), built field by field so a new internal field cannot leak.
 */
export function sharedComparisonView(row: ComparisonRow, vehicle: VehicleRow, workshopName: string) {
  const r = row.result as unknown as StoredComparison
  const labels = new Map(r.logs.map(l => [l.id, l.label]))
  const side = ({ logIds: _ids, ...rest }: StoredComparison['before']) => rest
  return {
    kind: 'comparison' as const,
    workshopName,
    vehicleDescription: vehicle.description,
    title: row.title,
    computedAt: row.computedAt,
    referenceAmbientC: r.referenceAmbientC,
    referencePressureRatio: r.referencePressureRatio,
    preCoolerAtReferenceC: r.preCoolerAtReferenceC,
    logs: r.logs.map(l => ({ side: l.side, label: l.label, recordedOn: l.recordedOn, coreName: l.coreName })),
    before: side(r.before),
    after: side(r.after),
    effectivenessGain: r.effectivenessGain,
    deltaOverAmbientChangeK: r.deltaOverAmbientChangeK,
    chargeTempAtReferenceChangeK: r.chargeTempAtReferenceChangeK,
    densityGainPct: r.densityGainPct,
    powerRecoveredPct: r.powerRecoveredPct,
    powerRecoveredKw: r.powerRecoveredKw,
    intervals: r.intervals,
    degreesOfFreedom: r.degreesOfFreedom,
    pulls: r.pulls.map(({ logId, ...p }) => ({ ...p, log: labels.get(logId) ?? '' })),
    unmatchedPulls: r.unmatchedPulls.map(({ logId: _logId, ...u }) => u),
    verdict: r.verdict,
    verdictTone: r.verdictTone,
    dynoSpreadNote: r.dynoSpreadNote,
    warnings: r.warnings,
    basis: r.basis,
    matching: r.matching,
  }
}

export function comparisonSides(comparisonId: number) {
  const rows = useDb().select().from(tables.comparisonLogs).where(eq(tables.comparisonLogs.comparisonId, comparisonId)).all()
  return {
    before: rows.filter(r => r.side === 'before').map(r => r.logId),
    after: rows.filter(r => r.side === 'after').map(r => r.logId),
  }
}

export function listComparisons(actor: Actor, vehicleId?: number) {
  const { comparisons, vehicles } = tables
  const rows = useDb().select({ comparison: comparisons, vehicle: vehicles })
    .from(comparisons)
    .innerJoin(vehicles, eq(vehicles.id, comparisons.vehicleId))
    .where(and(visibleComparisons(actor), vehicleId ? eq(comparisons.vehicleId, vehicleId) : undefined))
    .orderBy(desc(comparisons.createdAt), desc(comparisons.id))
    .all()
  return rows.map(({ comparison, vehicle }) => {
    const r = comparison.result as unknown as StoredComparison
    return {
      id: comparison.id,
      vehicleId: comparison.vehicleId,
      vehicleDescription: vehicle.description,
      title: comparison.title,
      referenceAmbientC: comparison.referenceAmbientC,
      computedAt: comparison.computedAt,
      staleAt: comparison.staleAt,
      createdAt: comparison.createdAt,
      beforeLogCount: r.before.logIds.length,
      afterLogCount: r.after.logIds.length,
      effectivenessGain: r.effectivenessGain,
      chargeTempAtReferenceChangeK: r.chargeTempAtReferenceChangeK,
      verdictTone: r.verdictTone,
      verdict: r.verdict,
    }
  })
}

/**
 * A log's pulls or conditions changed: every comparison using it says so until recomputed.
 * Called by the log PATCH route inside its transaction.
 */
export function markComparisonsStale(tx: Pick<Db, 'update' | 'select'>, logId: number) {
  const ids = tx.select({ id: tables.comparisonLogs.comparisonId }).from(tables.comparisonLogs).where(eq(tables.comparisonLogs.logId, logId)).all().map(r => r.id)
  if (ids.length) tx.update(tables.comparisons).set({ staleAt: new Date() }).where(inArray(tables.comparisons.id, ids)).run()
}
