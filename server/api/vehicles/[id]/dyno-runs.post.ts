import { eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const vehicle = findVisibleVehicle(actor, id)
  if (!canRecordDynoRuns(actor)) forbidden('Only a tuner or the workshop owner records dyno runs.')
  const input = await readBodyWith(event, dynoRunBody)
  assertCatalogueCore(actor, input.coreId)
  const run = useDb().transaction((tx) => {
    const row = tx.insert(tables.dynoRuns).values({
      workshopId: actor.workshopId,
      vehicleId: vehicle.id,
      label: input.label,
      side: input.side ?? null,
      coreId: input.coreId ?? null,
      powerKw: input.powerKw,
      torqueNm: input.torqueNm ?? null,
      rpm: input.rpm ?? null,
      ambientTempC: input.ambientTempC,
      baroKpa: input.baroKpa,
      humidityPct: input.humidityPct ?? null,
      runOn: input.runOn ?? null,
      createdById: actor.id,
    }).returning().get()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'created', entity: 'dyno-run', entityId: row.id, detail: { vehicleId: vehicle.id } })
    return row
  })
  const coreName = run.coreId ? useDb().select({ name: tables.cores.name }).from(tables.cores).where(eq(tables.cores.id, run.coreId)).get()?.name ?? null : null
  setResponseStatus(event, 201)
  return dynoRunView(run, vehicle, coreName)
})
