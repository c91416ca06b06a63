import { eq } from 'drizzle-orm'

// The core fitted when the log was made, by name (the report shows it to everyone who reads it).
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { log } = findVisibleLog(actor, id)
  const core = log.coreId
    ? useDb().select({ id: tables.cores.id, name: tables.cores.name, kind: tables.cores.kind }).from(tables.cores).where(eq(tables.cores.id, log.coreId)).get()
    : undefined
  return { core: core ?? null }
})
