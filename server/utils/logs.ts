import { randomBytes, createHash } from 'node:crypto'
import { mkdirSync, renameSync, rmSync, writeFileSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { and, eq, type SQL } from 'drizzle-orm'
import type { Actor } from '#shared/utils/abilities'
import {
  analyseLog,
  importLog,
  isLogImportError,
  type AnalysisResult,
  type ImportedLog,
  type LogMapping,
  type LogSource,
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

function analyseOptions(conditions: ConditionsInput, vehicle: VehicleRow, pullEdits?: PullEdits) {
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

export async function importAndAnalyse(source: LogSource, mapping: MappingInput | undefined, conditions: ConditionsInput, vehicle: VehicleRow, pullEdits?: PullEdits, driveIndex?: number) {
  try {
    const imported = await importLog(source, {
      drive: driveIndex,
      mapping,
      altitudeM: conditions.altitudeM ?? undefined,
      baroKpa: conditions.baroKpa ?? undefined,
      maxRows: LOG_UPLOAD_LIMITS.maxRows,
    })
    const analysis = analyseLog(imported, analyseOptions(conditions, vehicle, pullEdits))
    return { imported, analysis }
  }
  catch (error) {
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
    imported = await importLog({ path: logFilePath(log.id) }, {
      drive: log.driveIndex ?? undefined,
      mapping: log.mapping as MappingInput,
      altitudeM: log.conditions.altitudeM ?? undefined,
      baroKpa: log.conditions.baroKpa ?? undefined,
      maxRows: LOG_UPLOAD_LIMITS.maxRows,
    })
  }
  catch (error) {
    asHttpError(error)
  }
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

export interface NewLog {
  actor: Actor
  vehicle: VehicleRow
  bytes: Uint8Array
  originalName: string
  mapping?: MappingInput
  conditions: ConditionsInput
  notes?: string
  recordedOn?: string | null
  /** Which drive of a file holding several (see server/utils/drives.ts). */
  driveIndex?: number
}

// Analyse first, then write the file and the rows together: the file goes to a temporary name,
// and is renamed to its id inside the transaction, so a failure leaves neither row nor file.
export async function storeNewLog(input: NewLog) {
  const { actor, vehicle, bytes, originalName, conditions } = input
  const { imported, analysis } = await importAndAnalyse(bytes, input.mapping, conditions, vehicle, undefined, input.driveIndex)
  const temporary = join(uploadsDir(), 'logs', `.incoming-${randomBytes(8).toString('hex')}`)
  mkdirSync(dirname(temporary), { recursive: true })
  writeFileSync(temporary, bytes)
  let finalPath: string | undefined
  try {
    const log = useDb().transaction((tx) => {
      const row = tx.insert(tables.logs).values({
        workshopId: actor.workshopId,
        vehicleId: vehicle.id,
        uploadedById: actor.id,
        originalName: originalName.slice(0, 200),
        sizeBytes: bytes.byteLength,
        sha256: createHash('sha256').update(bytes).digest('hex'),
        mapping: mappingForStorage(imported.mapping),
        conditions: cleanConditions(conditions),
        status: 'analysed',
        rowCount: imported.rowCount,
        durationS: imported.durationS,
        notes: input.notes ?? '',
        recordedOn: input.recordedOn ?? null,
        driveIndex: input.driveIndex ?? null,
      }).returning().get()
      tx.insert(tables.analyses).values({ workshopId: actor.workshopId, logId: row.id, engineVersion: ENGINE_VERSION, result: analysis as unknown as Record<string, unknown> }).run()
      recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'uploaded', entity: 'log', entityId: row.id, detail: { vehicleId: vehicle.id, originalName, sizeBytes: bytes.byteLength, rows: imported.rowCount } })
      finalPath = logFilePath(row.id)
      renameSync(temporary, finalPath)
      return row
    })
    return { log, analysis }
  }
  catch (error) {
    rmSync(temporary, { force: true })
    if (finalPath) rmSync(finalPath, { force: true })
    throw error
  }
}

export function cleanConditions(conditions: ConditionsInput): Record<string, number | null> {
  const clean: Record<string, number | null> = {}
  for (const [key, value] of Object.entries(conditions)) {
    if (typeof value === 'number' && Number.isFinite(value)) clean[key] = value
  }
  return clean
}

export function storedAnalysis(logId: number): AnalysisResult {
  const row = useDb().select({ result: tables.analyses.result }).from(tables.analyses).where(eq(tables.analyses.logId, logId)).get()
  if (!row) notFound('Analysis')
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
