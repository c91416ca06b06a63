import { and, asc, eq } from 'drizzle-orm'
import { z } from 'zod'
import { canSeeAllVehicles, type Actor } from '#shared/utils/abilities'
import { compareDynoRuns, correctDynoRun, type DynoStandard } from '../analysis'

type DynoRunRow = typeof tables.dynoRuns.$inferSelect
type VehicleRow = typeof tables.vehicles.$inferSelect

export const DYNO_CAUTION = 'Dyno work is done by trained operators, with the car strapped down and the cell ventilated; follow the dyno maker\'s instructions and local rules. The correction describes the air on the day, not the engine\'s health.'

const number = (label: string, min: number, max: number, unit: string) =>
  z.number({ message: `${label} is a number` }).min(min, `${label} is between ${min} and ${max} ${unit}`).max(max, `${label} is between ${min} and ${max} ${unit}`)

export const dynoRunBody = z.object({
  label: z.string().trim().min(1, 'give the dyno run a label, e.g. "Before, run 1"').max(120),
  side: z.enum(['before', 'after'], { message: 'a dyno run is before or after the change' }).optional(),
  coreId: z.number().int().positive().nullable().optional(),
  powerKw: number('measured power', 1, 2000, 'kW'),
  torqueNm: number('torque', 1, 5000, 'Nm').nullable().optional(),
  rpm: number('engine speed', 300, 20000, 'rpm').nullable().optional(),
  ambientTempC: number('ambient temperature', -30, 60, '°C'),
  baroKpa: number('barometric pressure', 50, 110, 'kPa'),
  humidityPct: number('relative humidity', 0, 100, '%').nullable().optional(),
  runOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'the date is like 2026-08-02').nullable().optional(),
}).strict()

export function dynoRunView(run: DynoRunRow, vehicle: Pick<VehicleRow, 'fuel' | 'displacementL'>, coreName: string | null) {
  return {
    id: run.id,
    vehicleId: run.vehicleId,
    label: run.label,
    side: run.side,
    coreId: run.coreId,
    coreName,
    powerKw: run.powerKw,
    torqueNm: run.torqueNm,
    rpm: run.rpm,
    ambientTempC: run.ambientTempC,
    baroKpa: run.baroKpa,
    humidityPct: run.humidityPct,
    runOn: run.runOn,
    createdAt: run.createdAt,
    corrections: correctDynoRun(run, vehicle).map(c => ({ standard: c.standard, name: c.name, factor: c.factor, correctedPowerKw: c.correctedPowerKw, valid: c.valid, notes: c.notes })),
  }
}

export function vehicleDynoRuns(vehicle: VehicleRow) {
  const rows = useDb().select({ run: tables.dynoRuns, coreName: tables.cores.name })
    .from(tables.dynoRuns)
    .leftJoin(tables.cores, eq(tables.cores.id, tables.dynoRuns.coreId))
    .where(and(eq(tables.dynoRuns.vehicleId, vehicle.id), eq(tables.dynoRuns.workshopId, vehicle.workshopId)))
    .orderBy(asc(tables.dynoRuns.runOn), asc(tables.dynoRuns.id))
    .all()
  return rows.map(r => dynoRunView(r.run, vehicle, r.coreName))
}

/** Before vs after corrected power by one standard (the workshop's by default). */
export function dynoComparison(runs: ReturnType<typeof vehicleDynoRuns>, standard: DynoStandard) {
  const sided = runs.flatMap((run) => {
    const correction = run.corrections.find(c => c.standard === standard)
    return run.side && correction?.correctedPowerKw != null ? [{ side: run.side, correctedPowerKw: correction.correctedPowerKw }] : []
  })
  return compareDynoRuns(sided, standard)
}

export function workshopStandard(workshopId: number): DynoStandard {
  return useDb().select({ s: tables.workshops.correctionStandard }).from(tables.workshops).where(eq(tables.workshops.id, workshopId)).get()!.s
}

export function findVisibleDynoRun(actor: Actor, id: number) {
  const row = useDb().select({ run: tables.dynoRuns, vehicle: tables.vehicles })
    .from(tables.dynoRuns)
    .innerJoin(tables.vehicles, eq(tables.vehicles.id, tables.dynoRuns.vehicleId))
    .where(and(eq(tables.dynoRuns.id, id), eq(tables.dynoRuns.workshopId, actor.workshopId), canSeeAllVehicles(actor) ? undefined : eq(tables.vehicles.ownerId, actor.id)))
    .get()
  if (!row) notFound('Dyno run')
  return row
}

/** A core named for a log or a dyno run must be in the workshop's own catalogue. */
export function assertCatalogueCore(actor: Actor, coreId: number | null | undefined) {
  if (coreId == null) return
  const core = useDb().select({ id: tables.cores.id }).from(tables.cores).where(and(eq(tables.cores.id, coreId), eq(tables.cores.workshopId, actor.workshopId))).get()
  if (!core) throw createError({ statusCode: 422, message: 'That core is not in your workshop\'s core catalogue. Pick one from the list, or add it to the catalogue first.' })
}
