import { createHash } from 'node:crypto'
import { rm, writeFile } from 'node:fs/promises'
import { join } from 'node:path'
import { and, eq, type SQL } from 'drizzle-orm'
import type { Actor } from '#shared/utils/abilities'
import {
  isLogImportError,
  type AnalyseOptions,
  type AnalysisResult,
  type DriveInfo,
  type ImportOptions,
  type ImportedLog,
  type LogMapping,
  type MappingInput,
  type PullEdits,
} from '../analysis'

// Bumped when the engine's output changes meaning, so stored analyses can be told apart.
export const ENGINE_VERSION = '3'

export interface ConditionsInput {
  ambientTempC?: number | null
  altitudeM?: number | null
  baroKpa?: number | null
  humidityPct?: number | null
}

type LogRow = typeof tables.logs.$inferSelect
type VehicleRow = typeof tables.vehicles.$inferSelect

// The SQL condition for logs the actor may see: their workshop, and for a driver only logs of
// their own cars. Everything else is a 404.
export function visibleLogs(actor: Actor): SQL {
  const inWorkshop = eq(tables.logs.workshopId, actor.workshopId)
  return canSeeAllVehicles(actor) ? inWorkshop : and(inWorkshop, eq(tables.vehicles.ownerId, actor.id))!
}

export function findVisibleLog(actor: Actor, id: number) {
  const row = useDb().select({ log: tables.logs, vehicle: tables.vehicles })
    .from(tables.logs)
    .innerJoin(tables.vehicles, eq(tables.vehicles.id, tables.logs.vehicleId))
    .where(and(eq(tables.logs.id, id), visibleLogs(actor)))
    .get()
  if (!row) notFound('Log')
  return row
}

// An engine error is the file's or the mapping's fault: 422 with the engine's own message.
export function asHttpError(error: unknown): never {
  if (isLogImportError(error)) {
    throw createError({ statusCode: 422, message: error.message, data: { code: error.code, column: error.column, line: error.line, channel: error.channel, ...(error.drives ? { drives: error.drives } : {}) } })
  }
  throw error
}

function analyseOptions(conditions: ConditionsInput, vehicle: VehicleRow, pullEdits?: PullEdits): AnalyseOptions {
  return {
    ambientTempC: conditions.ambientTempC ?? undefined,
    altitudeM: conditions.altitudeM ?? undefined,
    baroKpa: conditions.baroKpa ?? undefined,
    humidityPct: conditions.humidityPct ?? undefined,
    ratedPowerKw: vehicle.ratedPowerKw ?? undefined,
    pullChannel: undefined,
    pullEdits,
  }
}

function importOptions(mapping: MappingInput | undefined, conditions: ConditionsInput, driveIndex?: number | null): ImportOptions {
  return {
    drive: driveIndex ?? undefined,
    mapping,
    altitudeM: conditions.altitudeM ?? undefined,
    baroKpa: conditions.baroKpa ?? undefined,
    maxRows: LOG_UPLOAD_LIMITS.maxRows,
  }
}

// Import and analysis of a file run in the worker pool (server/utils/analysis-pool.ts): a file
// just received ({ path } of its temporary file) or a stored one (server/utils/uploads.ts).
export async function importAndAnalyse(source: StoredLogSource, mapping: MappingInput | undefined, conditions: ConditionsInput, vehicle: VehicleRow, pullEdits?: PullEdits, driveIndex?: number | null) {
  try {
    return await analyseInWorker({ source, importOptions: importOptions(mapping, conditions, driveIndex), analyseOptions: analyseOptions(conditions, vehicle, pullEdits) })
  }
  catch (error) {
    asHttpError(error)
  }
}

// A stored log analysed again with new conditions or pull edits, from its file and stored mapping.
// A log deleted meanwhile is a 404, like any other missing log.
export async function reanalyseStoredLog(log: LogRow, conditions: ConditionsInput, vehicle: VehicleRow, pullEdits?: PullEdits): Promise<AnalysisResult> {
  const source = await storedLogSource(log.id)
  if (!source) notFound('Log')
  try {
    const { analysis } = await analyseInWorker({
      source,
      importOptions: importOptions(log.mapping as MappingInput, conditions, log.driveIndex),
      analyseOptions: analyseOptions(conditions, vehicle, pullEdits),
    })
    return analysis
  }
  catch (error) {
    if (!await hasLogFile(log.id)) notFound('Log')
    asHttpError(error)
  }
}

// A stored mapping is replayed exactly on re-analysis: column, unit and fixed value per channel.
export function mappingForStorage(mapping: LogMapping): MappingInput {
  const stored: MappingInput = {}
  for (const [channel, entry] of Object.entries(mapping) as [keyof LogMapping, NonNullable<LogMapping[keyof LogMapping]>][]) {
    if (entry.source === 'isa' || entry.source === 'entered') continue
    stored[channel] = { column: entry.column, unit: entry.unit, ...(entry.value !== undefined ? { value: entry.value } : {}) }
  }
  return stored
}

// Parsed channels of recently viewed logs, so zooming a chart does not re-read a large file each
// time. Bounded: a few logs at most; keyed by the file's hash and mapping so edits invalidate it.
const channelCache = new Map<string, ImportedLog>()
const CHANNEL_CACHE_SIZE = 4
const importsInFlight = new Map<string, Promise<ImportedLog>>()

export async function loadImported(log: LogRow) {
  const key = `${log.id}:${log.sha256}:${JSON.stringify(log.mapping)}:${log.conditions.altitudeM ?? ''}:${log.conditions.baroKpa ?? ''}`
  const cached = channelCache.get(key)
  if (cached) {
    channelCache.delete(key)
    channelCache.set(key, cached)
    return cached
  }
  let imported: ImportedLog
  try {
    // Readers of the same log (a report opens several charts at once) share one import.
    let pending = importsInFlight.get(key)
    if (!pending) {
      pending = storedLogSource(log.id)
        .then((source) => {
          if (!source) notFound('Log')
          return importInWorker({ source, importOptions: importOptions(log.mapping as MappingInput, log.conditions, log.driveIndex) })
        })
        .finally(() => importsInFlight.delete(key))
      importsInFlight.set(key, pending)
    }
    imported = await pending
  }
  catch (error) {
    // The log was deleted while its file was being read: it is gone, not broken.
    if (!await hasLogFile(log.id)) notFound('Log')
    asHttpError(error)
  }
  if (!await hasLogFile(log.id)) notFound('Log')
  for (const old of channelCache.keys()) {
    if (old.startsWith(`${log.id}:`)) channelCache.delete(old)
  }
  channelCache.set(key, imported)
  while (channelCache.size > CHANNEL_CACHE_SIZE) channelCache.delete(channelCache.keys().next().value!)
  return imported
}

export function forgetImported(logId: number) {
  for (const key of channelCache.keys()) {
    if (key.startsWith(`${logId}:`)) channelCache.delete(key)
  }
}

/** The log file: bytes in memory (the demo seed), or a temporary file an upload streamed to disk. */
export type NewLogFile = { bytes: Uint8Array } | { temporaryPath: string, sizeBytes: number, sha256: string }

export interface NewLog {
  actor: Actor
  vehicle: VehicleRow
  file: NewLogFile
  originalName: string
  mapping?: MappingInput
  conditions: ConditionsInput
  notes?: string
  recordedOn?: string | null
  coreId?: number | null
  /** Which drive of a file holding several (see server/utils/drives.ts). */
  driveIndex?: number
}

export function incomingDir() {
  return join(uploadsDir(), 'incoming')
}

// The file is analysed from its temporary name in the worker pool; then the rows are written and
// the file kept in the uploads storage under the new id (server/utils/uploads.ts). If keeping the
// file fails, the rows go again, so a failure leaves neither row nor file. The upload is audited
// only once its file is kept.
export async function storeNewLog(input: NewLog) {
  const { actor, vehicle, conditions } = input
  let temporary: string
  let sizeBytes: number
  let sha256: string
  if ('bytes' in input.file) {
    temporary = temporaryUploadPath(incomingDir())
    await writeFile(temporary, input.file.bytes)
    sizeBytes = input.file.bytes.byteLength
    sha256 = createHash('sha256').update(input.file.bytes).digest('hex')
  }
  else {
    ({ temporaryPath: temporary, sizeBytes, sha256 } = input.file)
  }
  const originalName = cleanFileName(input.originalName)
  try {
    const { analysis, mapping, rowCount, durationS } = await importAndAnalyse({ path: temporary }, input.mapping, conditions, vehicle, undefined, input.driveIndex)
    const log = useDb().transaction((tx) => {
      const row = tx.insert(tables.logs).values({
        workshopId: actor.workshopId,
        vehicleId: vehicle.id,
        uploadedById: actor.id,
        originalName,
        sizeBytes,
        sha256,
        mapping: mappingForStorage(mapping),
        conditions: cleanConditions(conditions),
        status: 'analysed',
        rowCount,
        durationS,
        notes: input.notes ?? '',
        recordedOn: input.recordedOn ?? null,
        coreId: input.coreId !== undefined ? input.coreId : vehicle.fittedCoreId,
        driveIndex: input.driveIndex ?? null,
      }).returning().get()
      tx.insert(tables.analyses).values({ workshopId: actor.workshopId, logId: row.id, engineVersion: ENGINE_VERSION, result: analysis as unknown as Record<string, unknown> }).run()
      return row
    })
    try {
      await keepLogFile(log.id, temporary)
      recordAudit(useDb(), { workshopId: actor.workshopId, userId: actor.id, action: 'uploaded', entity: 'log', entityId: log.id, detail: { vehicleId: vehicle.id, originalName, sizeBytes, rows: rowCount } })
    }
    catch (error) {
      // Its analysis goes with it (ON DELETE CASCADE).
      useDb().delete(tables.logs).where(eq(tables.logs.id, log.id)).run()
      await removeLogFile(log.id)
      console.error(`[uploads] The file of a new log could not be kept: ${(error as Error).message}`)
      throw createError({ statusCode: 503, message: 'The log could not be stored just now: the file storage did not take it. Nothing was saved; try again in a minute, and tell the workshop owner if it keeps happening.' })
    }
    return { log, analysis }
  }
  finally {
    // Renamed into the storage with the fs driver; copied and no longer needed with any other.
    await rm(temporary, { force: true })
  }
}

export function cleanConditions(conditions: ConditionsInput): Record<string, number | null> {
  const clean: Record<string, number | null> = {}
  for (const [key, value] of Object.entries(conditions)) {
    if (typeof value === 'number' && Number.isFinite(value)) clean[key] = value
  }
  return clean
}

export async function storedAnalysis(logId: number): Promise<AnalysisResult> {
  const row = useDb().select({ result: tables.analyses.result, engineVersion: tables.analyses.engineVersion }).from(tables.analyses).where(eq(tables.analyses.logId, logId)).get()
  if (!row) notFound('Analysis')
  // Written by an older engine: analysed again from the stored file (server/utils/reanalyse.ts).
  if (row.engineVersion !== ENGINE_VERSION) return reanalyseStale(logId, row.engineVersion)
  return row.result as unknown as AnalysisResult
}

export function logDetail(log: LogRow, vehicle: VehicleRow, channels?: string[]) {
  const uploadedBy = log.uploadedById
    ? useDb().select({ name: tables.users.name }).from(tables.users).where(eq(tables.users.id, log.uploadedById)).get()
    : undefined
  const mapped = channels ?? Object.keys(log.mapping).filter(c => c !== 'time')
  return {
    id: log.id,
    vehicleId: log.vehicleId,
    vehicle: { id: vehicle.id, description: vehicle.description, ratedPowerKw: vehicle.ratedPowerKw, fuel: vehicle.fuel, ownerId: vehicle.ownerId },
    originalName: log.originalName,
    sizeBytes: log.sizeBytes,
    rowCount: log.rowCount,
    durationS: log.durationS,
    conditions: log.conditions,
    notes: log.notes,
    pullEdits: log.pullEdits,
    mapping: log.mapping,
    channels: mapped,
    recordedOn: log.recordedOn,
    createdAt: log.createdAt,
    uploadedByName: uploadedBy?.name ?? null,
  }
}

// The drives a file holds (several joined drives, or one), read in the worker pool like any import.
export async function drivesInFile(path: string, mapping: MappingInput | undefined, conditions: ConditionsInput): Promise<DriveInfo[]> {
  try {
    return (await importInWorker({ source: { path }, importOptions: importOptions(mapping, conditions) })).drives
  }
  catch (error) {
    if (isLogImportError(error) && error.code === 'SEVERAL_DRIVES' && error.drives) return error.drives as DriveInfo[]
    asHttpError(error)
  }
}
