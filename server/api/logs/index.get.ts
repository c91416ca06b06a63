import { and, desc, eq } from 'drizzle-orm'
import { z } from 'zod'

const query = z.object({ vehicleId: z.coerce.number().int().positive().optional() })

interface SummaryFields {
  summary?: { pullCount?: number, peakChargeTempC?: number | null, maxPowerLossVsCoolestPct?: number | null, soakIndexKPerPull?: number | null, meanEffectiveness?: number | null }
}

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { vehicleId } = readQueryWith(event, query)
  const { logs, vehicles, users, analyses } = tables
  const rows = useDb()
    .select({
      id: logs.id,
      vehicleId: logs.vehicleId,
      vehicleDescription: vehicles.description,
      originalName: logs.originalName,
      sizeBytes: logs.sizeBytes,
      rowCount: logs.rowCount,
      durationS: logs.durationS,
      recordedOn: logs.recordedOn,
      createdAt: logs.createdAt,
      uploadedByName: users.name,
      notes: logs.notes,
      result: analyses.result,
    })
    .from(logs)
    .innerJoin(vehicles, eq(vehicles.id, logs.vehicleId))
    .leftJoin(users, eq(users.id, logs.uploadedById))
    .leftJoin(analyses, eq(analyses.logId, logs.id))
    .where(and(visibleLogs(actor), vehicleId ? eq(logs.vehicleId, vehicleId) : undefined))
    .orderBy(desc(logs.createdAt), desc(logs.id))
    .all()
  return rows.map(({ result, ...row }) => {
    const summary = (result as SummaryFields | null)?.summary ?? {}
    return {
      ...row,
      summary: {
        pullCount: summary.pullCount ?? 0,
        peakChargeTempC: summary.peakChargeTempC ?? null,
        maxPowerLossVsCoolestPct: summary.maxPowerLossVsCoolestPct ?? null,
        soakIndexKPerPull: summary.soakIndexKPerPull ?? null,
        meanEffectiveness: summary.meanEffectiveness ?? null,
      },
    }
  })
})
