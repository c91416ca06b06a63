import { z } from 'zod'

const logIds = z.array(z.number().int().positive()).max(20, 'choose at most 20 logs a side')

const body = z.object({
  vehicleId: z.number({ message: 'choose the car' }).int().positive('choose the car'),
  beforeLogIds: logIds,
  afterLogIds: logIds,
  referenceAmbientC: z.number({ message: 'the reference ambient temperature is a number in °C' }).min(-30, 'the reference ambient temperature is between −30 and 55 °C').max(55, 'the reference ambient temperature is between −30 and 55 °C').default(25),
  title: z.string().trim().max(160).default(''),
}).strict()

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const input = await readBodyWith(event, body)
  const vehicle = findVisibleVehicle(actor, input.vehicleId)
  if (!canCompareLogs(actor)) forbidden('Only a tuner or the workshop owner builds comparisons. You can read the ones on this car.')
  const result = await computeComparison(actor, vehicle, { before: input.beforeLogIds, after: input.afterLogIds }, input.referenceAmbientC)
  const row = useDb().transaction((tx) => {
    const comparison = tx.insert(tables.comparisons).values({
      workshopId: actor.workshopId,
      vehicleId: vehicle.id,
      title: input.title,
      referenceAmbientC: input.referenceAmbientC,
      result: result as unknown as Record<string, unknown>,
      computedAt: new Date(),
      createdById: actor.id,
    }).returning().get()
    tx.insert(tables.comparisonLogs).values(result.logs.map(l => ({ comparisonId: comparison.id, logId: l.id, side: l.side }))).run()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'created', entity: 'comparison', entityId: comparison.id, detail: { vehicleId: vehicle.id, before: input.beforeLogIds, after: input.afterLogIds } })
    return comparison
  })
  setResponseStatus(event, 201)
  return { id: row.id }
})
