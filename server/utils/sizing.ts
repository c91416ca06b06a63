import { and, eq, inArray } from 'drizzle-orm'
import { z } from 'zod'
import type { Actor } from '#shared/utils/abilities'
import type { AnalysisResult, LogMapping } from '../analysis'
import { isSizingError, sizeCores, type SizingCore, type SizingResult } from '../analysis/sizing'

export const sizingBody = z.object({
  vehicleId: z.number({ message: 'pick a car' }).int().positive(),
  logId: z.number({ message: 'pick an analysed log of the car' }).int().positive(),
  candidateCoreIds: z.array(z.number().int().positive(), { message: 'pick the cores to compare' })
    .min(1, 'pick at least one core to compare').max(12, 'compare at most 12 cores at once')
    .refine(ids => new Set(ids).size === ids.length, 'each core is picked once'),
  design: z.object({
    ambientC: z.number({ message: 'enter the ambient temperature in °C' }).min(-30, 'between −30 and 55 °C').max(55, 'between −30 and 55 °C'),
    boostKpaAbs: z.number({ message: 'enter the boost as an absolute pressure in kPa' }).min(50, 'an absolute pressure between 50 and 400 kPa').max(400, 'an absolute pressure between 50 and 400 kPa').optional(),
    targetPowerKw: z.number({ message: 'enter the target power in kW' }).positive('above 0 kW').max(1500, 'at most 1500 kW').optional(),
    roadSpeedKmh: z.number({ message: 'enter the road speed in km/h' }).min(20, 'between 20 and 300 km/h').max(300, 'between 20 and 300 km/h').optional(),
  }, { message: 'enter the design conditions' }).strict(),
}).strict()

export const SIZING_LABELS: Record<string, string> = {
  'vehicleId': 'Car',
  'logId': 'Log',
  'candidateCoreIds': 'Cores to compare',
  'design': 'Design conditions',
  'design.ambientC': 'Ambient temperature',
  'design.boostKpaAbs': 'Boost',
  'design.targetPowerKw': 'Target power',
  'design.roadSpeedKmh': 'Road speed',
}

const unprocessable = (message: string): never => {
  throw createError({ statusCode: 422, message })
}

const toSizingCore = (core: typeof tables.cores.$inferSelect): SizingCore => ({
  id: core.id, name: core.name, faceWidthMm: core.faceWidthMm, faceHeightMm: core.faceHeightMm, depthMm: core.depthMm,
})

// Mean MAF reading inside the pulls, when the log maps that channel (the analysis does not keep it).
async function meanMafOverPulls(log: typeof tables.logs.$inferSelect, analysis: AnalysisResult): Promise<number | null> {
  if (!('massAirFlow' in (log.mapping as LogMapping))) return null
  const imported = await loadImported(log)
  const maf = imported.channels.massAirFlowKgPerS
  if (!maf) return null
  const time = imported.channels.timeS
  let sum = 0
  let count = 0
  for (const pull of analysis.pulls) {
    for (let i = 0; i < time.length; i++) {
      const t = time[i]!
      if (t < pull.startS || t > pull.endS) continue
      const value = maf[i]!
      if (Number.isFinite(value)) {
        sum += value
        count++
      }
    }
  }
  return count ? sum / count : null
}

export async function runSizing(actor: Actor, input: z.infer<typeof sizingBody>) {
  const db = useDb()
  const vehicle = findVisibleVehicle(actor, input.vehicleId)
  const log = db.select().from(tables.logs)
    .where(and(eq(tables.logs.id, input.logId), eq(tables.logs.workshopId, actor.workshopId), eq(tables.logs.vehicleId, vehicle.id))).get()
  if (!log) notFound('Log')
  if (log.status !== 'analysed') unprocessable('That log has no analysis. Pick an analysed log of this car.')
  const analysis = await storedAnalysis(log.id)

  // The core fitted when the log was made; a log that does not say falls back to the car's core.
  const fittedCoreId = log.coreId ?? vehicle.fittedCoreId
  if (fittedCoreId == null) unprocessable('Neither the log nor the car says which core was fitted. Set the car\'s fitted core (or the log\'s) first, so the log can calibrate it.')
  const fitted = db.select().from(tables.cores).where(and(eq(tables.cores.id, fittedCoreId!), eq(tables.cores.workshopId, actor.workshopId))).get()
  if (!fitted) unprocessable('The core recorded for this log is no longer in the catalogue. Set the car\'s fitted core again.')

  const candidates = db.select().from(tables.cores)
    .where(and(inArray(tables.cores.id, input.candidateCoreIds), eq(tables.cores.workshopId, actor.workshopId))).all()
  if (candidates.length !== input.candidateCoreIds.length) notFound('Core')
  const retired = candidates.filter(core => core.retiredAt !== null)
  if (retired.length) unprocessable(`${retired.map(c => `"${c.name}"`).join(', ')} ${retired.length === 1 ? 'is' : 'are'} retired from the catalogue and not offered for new sizing. Leave ${retired.length === 1 ? 'it' : 'them'} out, or bring ${retired.length === 1 ? 'it' : 'them'} back first.`)
  const ordered = input.candidateCoreIds.map(id => candidates.find(core => core.id === id)!)

  let result: SizingResult
  try {
    result = sizeCores({
      engine: { displacementL: vehicle.displacementL, fuel: vehicle.fuel },
      log: { pulls: analysis.pulls, baroKpa: analysis.summary.baroKpa, massAirFlowKgS: await meanMafOverPulls(log, analysis) },
      fittedCore: toSizingCore(fitted!),
      candidates: ordered.map(toSizingCore),
      design: input.design,
    })
  }
  catch (error) {
    if (isSizingError(error)) unprocessable(error.message)
    throw error
  }

  const id = db.transaction((tx) => {
    const row = tx.insert(tables.sizings).values({
      workshopId: actor.workshopId,
      vehicleId: vehicle.id,
      logId: log.id,
      design: input.design,
      result: result as unknown as Record<string, unknown>,
      createdById: actor.id,
    }).returning({ id: tables.sizings.id }).get()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'sized', entity: 'sizing', entityId: row.id, detail: { vehicleId: vehicle.id, logId: log.id, coreIds: input.candidateCoreIds } })
    return row.id
  })
  return { id, vehicleId: vehicle.id, logId: log.id, ...result }
}

export function findSizing(actor: Actor, id: number) {
  const row = useDb().select().from(tables.sizings)
    .where(and(eq(tables.sizings.id, id), eq(tables.sizings.workshopId, actor.workshopId))).get()
  if (!row) notFound('Sizing')
  return { id: row.id, vehicleId: row.vehicleId, logId: row.logId, createdAt: row.createdAt, ...(row.result as unknown as SizingResult) }
}
