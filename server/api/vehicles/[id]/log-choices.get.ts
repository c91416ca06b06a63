import { and, desc, eq } from 'drizzle-orm'
import type { AnalysisResult } from '../../../analysis'

// The car's logs as the comparison picker shows them: day, core, ambient temperature, pull count
// and mean effectiveness, so the before and after choice is an informed one.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const vehicle = findVisibleVehicle(actor, id)
  const { logs, analyses, cores } = tables
  const rows = useDb().select({ log: logs, result: analyses.result, coreName: cores.name })
    .from(logs)
    .leftJoin(analyses, eq(analyses.logId, logs.id))
    .leftJoin(cores, eq(cores.id, logs.coreId))
    .where(and(eq(logs.vehicleId, vehicle.id), eq(logs.workshopId, actor.workshopId)))
    .orderBy(desc(logs.recordedOn), desc(logs.id))
    .all()
  return rows.map(({ log, result, coreName }) => {
    const summary = (result as unknown as AnalysisResult | null)?.summary
    return {
      id: log.id,
      label: logLabel(log),
      originalName: log.originalName,
      recordedOn: log.recordedOn,
      createdAt: log.createdAt,
      coreId: log.coreId,
      coreName: coreName ?? null,
      ambientTempC: summary?.ambientTempC ?? null,
      pullCount: summary?.pullCount ?? 0,
      meanEffectiveness: summary?.meanEffectiveness ?? null,
      effectivenessSource: summary?.effectivenessSource ?? null,
    }
  })
})
