import { and, eq } from 'drizzle-orm'
import { spreadOf, type AnalysisResult } from '../../../analysis'

// Every log the workshop took with this core, across its cars: the shop's own evidence for the
// next customer's choice. Scoped to the workshop; nothing from another workshop is read.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canViewCoreEvidence(actor)) forbidden('The evidence per core is for the workshop\'s staff.')
  const { id } = readParamsWith(event, idParams)
  const db = useDb()
  const core = db.select().from(tables.cores).where(and(eq(tables.cores.id, id), eq(tables.cores.workshopId, actor.workshopId))).get()
  if (!core) notFound('Core')
  const rows = db.select({ log: tables.logs, vehicle: tables.vehicles, result: tables.analyses.result })
    .from(tables.logs)
    .innerJoin(tables.vehicles, eq(tables.vehicles.id, tables.logs.vehicleId))
    .innerJoin(tables.analyses, eq(tables.analyses.logId, tables.logs.id))
    .where(and(eq(tables.logs.coreId, core.id), eq(tables.logs.workshopId, actor.workshopId)))
    .all()

  const effectiveness: number[] = []
  const deltas: number[] = []
  let estimatedPullCount = 0
  const perVehicle = new Map<number, { id: number, description: string, registration: string, logCount: number, pullCount: number, effectiveness: number[] }>()
  for (const { log, vehicle, result } of rows) {
    const pulls = (result as unknown as AnalysisResult).pulls ?? []
    const entry = perVehicle.get(vehicle.id) ?? { id: vehicle.id, description: vehicle.description, registration: vehicle.registration, logCount: 0, pullCount: 0, effectiveness: [] }
    entry.logCount++
    entry.pullCount += pulls.length
    for (const pull of pulls) {
      // Pulls are the full-load stretches, so their ΔT over ambient is the full-load figure.
      if (Number.isFinite(pull.meanDeltaOverAmbientK)) deltas.push(pull.meanDeltaOverAmbientK)
      if (pull.effectiveness == null || !Number.isFinite(pull.effectiveness)) continue
      // Only measured effectiveness is evidence; an estimate from boost reads low.
      if (pull.effectivenessSource === 'measured') {
        effectiveness.push(pull.effectiveness)
        entry.effectiveness.push(pull.effectiveness)
      }
      else {
        estimatedPullCount++
      }
    }
    perVehicle.set(log.vehicleId, entry)
  }
  return {
    coreId: core.id,
    core: { id: core.id, name: core.name, kind: core.kind, faceWidthMm: core.faceWidthMm, faceHeightMm: core.faceHeightMm, depthMm: core.depthMm, retired: core.retiredAt !== null },
    logCount: rows.length,
    pullCount: deltas.length,
    measuredPullCount: effectiveness.length,
    estimatedPullCount,
    effectiveness: spreadOf(effectiveness),
    deltaOverAmbientK: spreadOf(deltas),
    vehicles: [...perVehicle.values()].map(({ effectiveness: values, ...v }) => ({ ...v, medianEffectiveness: spreadOf(values).median })),
  }
})
