import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { parseMappingInput, type MappingInput } from '../../analysis'

const optionalNumber = (label: string, min: number, max: number, unit: string) => z.preprocess(
  value => value === '' || value === undefined ? undefined : value,
  z.coerce.number({ message: `${label} must be a number` }).min(min, `${label} must be between ${min} and ${max} ${unit}`).max(max, `${label} must be between ${min} and ${max} ${unit}`).optional(),
)

const fields = z.object({
  vehicleId: z.coerce.number({ message: 'vehicleId: choose the car this log belongs to' }).int().positive('vehicleId: choose the car this log belongs to'),
  mapping: z.string().max(20_000).optional(),
  ambientTempC: optionalNumber('ambientTempC (ambient temperature)', -40, 60, '°C'),
  altitudeM: optionalNumber('altitudeM (site altitude)', -500, 6000, 'm'),
  baroKpa: optionalNumber('baroKpa (barometric pressure)', 50, 110, 'kPa'),
  humidityPct: optionalNumber('humidityPct (relative humidity)', 0, 100, '%'),
  profileId: z.coerce.number().int().positive().optional(),
  notes: z.string().max(5000).optional(),
  recordedOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'recordedOn is a date like 2026-07-14').optional(),
  // Several drives in one file: "all" or drive numbers "0,2" (server/utils/drives.ts).
  drives: z.string().max(200).optional(),
})

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const declared = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (declared > LOG_UPLOAD_LIMITS.maxBytes + 1024 * 1024) tooLarge()

  let parts: Awaited<ReturnType<typeof readMultipartFormData>>
  try {
    parts = await readMultipartFormData(event)
  }
  catch {
    badRequest('The upload could not be read. Send the log as multipart/form-data with a "file" field.')
  }
  if (!parts) badRequest('Nothing was uploaded. Send the log as multipart/form-data with a "file" field.')

  const raw: Record<string, string> = {}
  let file: { name: string, data: Buffer } | undefined
  for (const part of parts) {
    if (!part.name) continue
    if (part.name === 'file') {
      if (file) badRequest('Send one log file per upload.')
      file = { name: part.filename ?? 'log.csv', data: part.data }
    }
    else {
      raw[part.name] = part.data.toString('utf8')
    }
  }
  const parsed = fields.safeParse(raw)
  if (!parsed.success) badRequest(`The upload form is not valid — ${describeIssues(parsed.error)}. Correct it and try again.`)
  const input = parsed.data

  const vehicle = findVisibleVehicle(actor, input.vehicleId)
  if (!canUploadLog(actor, vehicle)) forbidden('Your role cannot upload logs. Ask a tuner, or the car\'s owner.')

  if (!file) badRequest('No file was attached. Choose the log file (.csv, .txt or .log) and send it again.')
  const problem = checkLogFile(file.name, file.data.byteLength)
  if (problem) {
    throw createError({ statusCode: file.data.byteLength > LOG_UPLOAD_LIMITS.maxBytes ? 413 : file.data.byteLength === 0 ? 400 : 415, message: problem })
  }

  let mapping: MappingInput | undefined
  if (input.mapping) {
    try {
      mapping = parseMappingInput(input.mapping)
    }
    catch (error) {
      asHttpError(error)
    }
  }
  else if (input.profileId) {
    const profile = useDb().select().from(tables.logProfiles)
      .where(and(eq(tables.logProfiles.id, input.profileId), eq(tables.logProfiles.workshopId, actor.workshopId))).get()
    if (!profile) notFound('Log profile')
    mapping = profile.mapping as MappingInput
  }

  const newLog = {
    actor,
    vehicle,
    bytes: file.data,
    originalName: file.name,
    mapping,
    conditions: { ambientTempC: input.ambientTempC, altitudeM: input.altitudeM, baroKpa: input.baroKpa, humidityPct: input.humidityPct },
    notes: input.notes,
    recordedOn: input.recordedOn,
  }
  // Drive choice given: one log per chosen drive (server/utils/drives.ts), answered with their ids.
  if (input.drives !== undefined) {
    const ids = await storeChosenDrives(newLog, input.drives)
    setResponseStatus(event, 201)
    return { ids }
  }
  const { log } = await storeNewLog(newLog)
  setResponseStatus(event, 201)
  return logDetail(log, vehicle)
})

function tooLarge(): never {
  throw createError({ statusCode: 413, message: `The file is larger than ${LOG_UPLOAD_LIMITS.maxBytes / 1024 / 1024} MB. Trim the log to the session with the hard runs, or export fewer channels, and upload again.` })
}
