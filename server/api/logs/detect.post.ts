import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { previewColumns } from '../../analysis'

const body = z.object({
  sample: z.string().min(1, 'the file is empty').max(600_000, 'send only the first 512 KB of the file'),
  fileName: z.string().max(200).default('log.csv'),
})

// The upload form sends the start of the file; the engine answers with the detected format and
// mapping (one implementation, the server's), plus a saved profile for the same header if any.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!(actor.role === 'owner' || actor.role === 'tuner' || actor.role === 'driver')) forbidden('Your role does not upload logs.')
  const { sample, fileName } = await readBodyWith(event, body)
  const problem = checkLogFile(fileName, 1)
  if (problem) throw createError({ statusCode: 415, message: problem })
  let preview
  try {
    preview = await previewColumns(new TextEncoder().encode(sample), { rows: 20 })
  }
  catch (error) {
    asHttpError(error)
  }
  const profile = useDb().select({ id: tables.logProfiles.id, name: tables.logProfiles.name, mapping: tables.logProfiles.mapping })
    .from(tables.logProfiles)
    .where(and(eq(tables.logProfiles.workshopId, actor.workshopId), eq(tables.logProfiles.headerSignature, preview.headerSignature)))
    .get()
  return { ...preview, profile: profile ?? null }
})
