import { and, asc, desc, eq, isNull } from 'drizzle-orm'
import { z } from 'zod'

const query = z.object({ vehicleId: z.coerce.number({ message: 'pick a car' }).int().positive() })

// What the sizing page offers for one car: its analysed logs with the core each was made with,
// and the current (not retired) catalogue.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canSizeCores(actor)) forbidden('Sizing a core is the workshop\'s job. Ask the workshop about an uprated core.')
  const { vehicleId } = readQueryWith(event, query)
  const vehicle = findVisibleVehicle(actor, vehicleId)
  const db = useDb()
  const { logs, analyses, cores } = tables
  const rows = db.select({ log: logs, result: analyses.result }).from(logs)
    .innerJoin(analyses, eq(analyses.logId, logs.id))
    .where(and(eq(logs.vehicleId, vehicle.id), eq(logs.workshopId, actor.workshopId), eq(logs.status, 'analysed')))
    .orderBy(desc(logs.createdAt), desc(logs.id)).all()
  const catalogue = db.select().from(cores).where(and(eq(cores.workshopId, actor.workshopId), isNull(cores.retiredAt))).orderBy(asc(cores.name)).all()
  // A log made with a core now retired still names it.
  const coreIds = new Set(rows.map(r => r.log.coreId ?? vehicle.fittedCoreId).filter((v): v is number => v != null))
  const named = coreIds.size
    ? db.select().from(cores).where(eq(cores.workshopId, actor.workshopId)).all().filter(c => coreIds.has(c.id))
    : []
  return {
    vehicle: { id: vehicle.id, description: vehicle.description, fittedCoreId: vehicle.fittedCoreId, ratedPowerKw: vehicle.ratedPowerKw },
    logs: rows.map(({ log, result }) => {
      const summary = (result as { summary?: { pullCount?: number, meanEffectiveness?: number | null, effectivenessSource?: string | null, ambientTempC?: number | null } }).summary ?? {}
      const coreId = log.coreId ?? vehicle.fittedCoreId
      return {
        id: log.id,
        originalName: log.originalName,
        recordedOn: log.recordedOn,
        createdAt: log.createdAt,
        coreId,
        coreFromCar: log.coreId == null,
        pullCount: summary.pullCount ?? 0,
        meanEffectiveness: summary.meanEffectiveness ?? null,
        effectivenessSource: summary.effectivenessSource ?? null,
        ambientTempC: summary.ambientTempC ?? null,
      }
    }),
    cores: catalogue.map(coreView),
    logCores: named.map(coreView),
  }
})
