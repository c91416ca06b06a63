import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { previewColumns } from '../../analysis'

// The page sends the first 512 KB of the file as bytes (application/octet-stream, read within that
// limit by server/middleware/02.request-guard.ts), so the engine decodes them exactly as the import
// will: a UTF-16 or Windows-1252 log shows the same headers here as after the upload. The answer
// is kept small too: previews show short cells, and a file with more columns than any logger
// writes is refused rather than described column by column (a 590 KB sample once became a 7 MB answer).
const MAX_COLUMNS = 256
const PREVIEW_CELL_CHARS = 40
const MAX_ANSWER_CHARS = 256 * 1024

const query = z.object({
  fileName: z.string().max(200).default('log.csv'),
})

const trimCell = (cell: string) => cell.length > PREVIEW_CELL_CHARS ? `${cell.slice(0, PREVIEW_CELL_CHARS - 1)}…` : cell

// The upload form sends the start of the file; the engine answers with the detected format and
// mapping (one implementation, the server's), plus a saved profile for the same header if any.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  if (!canUploadLogs(actor)) forbidden('Your role does not upload logs.')
  const { fileName } = readQueryWith(event, query)
  const problem = checkLogFile(fileName, 1)
  if (problem) throw createError({ statusCode: 415, message: problem })
  const sample = await readRawBody(event, false)
  if (!sample?.length) badRequest('The file is empty. Choose the CSV export of the log itself.')
  let preview
  try {
    preview = await previewColumns(sample, { rows: 20 })
  }
  catch (error) {
    asHttpError(error)
  }
  if (preview.columns.length > MAX_COLUMNS) {
    throw createError({ statusCode: 422, message: `This file has ${preview.columns.length} columns; a log can have at most ${MAX_COLUMNS}. Export only the channels you logged for the pulls and try again.` })
  }
  preview.rows = preview.rows.map(row => row.slice(0, MAX_COLUMNS).map(trimCell))
  preview.columns = preview.columns.map(column => ({ ...column, samples: column.samples.map(trimCell) }))
  const profile = useDb().select({ id: tables.logProfiles.id, name: tables.logProfiles.name, mapping: tables.logProfiles.mapping })
    .from(tables.logProfiles)
    .where(and(eq(tables.logProfiles.workshopId, actor.workshopId), eq(tables.logProfiles.headerSignature, preview.headerSignature)))
    .get()
  const answer = { ...preview, profile: profile ?? null }
  if (JSON.stringify(answer).length > MAX_ANSWER_CHARS) {
    throw createError({ statusCode: 422, message: 'The start of this file has very long column names or cells; it does not look like a log. Export the log from the logger as CSV text and try again.' })
  }
  return answer
})
