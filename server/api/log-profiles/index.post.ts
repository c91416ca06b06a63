import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { parseMappingInput } from '../../analysis'

const body = z.object({
  name: z.string().trim().min(2, 'give the profile a name, e.g. "Blue OBD dongle, 1 Hz"').max(80),
  headerSignature: z.string().min(3).max(64),
  mapping: z.record(z.string(), z.unknown()),
})

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canManageLogProfiles(actor)) forbidden('Only a tuner or the workshop owner saves log profiles for the workshop.')
  const input = await readBodyWith(event, body)
  let mapping
  try {
    mapping = parseMappingInput(input.mapping)
  }
  catch (error) {
    asHttpError(error)
  }
  const db = useDb()
  const clash = db.select({ id: tables.logProfiles.id }).from(tables.logProfiles)
    .where(and(eq(tables.logProfiles.workshopId, actor.workshopId), eq(tables.logProfiles.name, input.name))).get()
  if (clash) throw createError({ statusCode: 409, message: `A log profile called "${input.name}" exists already. Choose another name.` })
  const profile = db.transaction((tx) => {
    const row = tx.insert(tables.logProfiles).values({ workshopId: actor.workshopId, name: input.name, headerSignature: input.headerSignature, mapping: mapping as Record<string, unknown>, createdById: actor.id }).returning().get()
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: 'created', entity: 'log-profile', entityId: row.id })
    return row
  })
  setResponseStatus(event, 201)
  return profile
})
