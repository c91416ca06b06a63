import { rm } from 'node:fs/promises'
import type { H3Event } from 'h3'
import { and, eq } from 'drizzle-orm'
import { z } from 'zod'
import { parseMappingInput, type MappingInput } from '../../analysis'

const optionalNumber = (key: ConditionKey) => {
  const { min, max, label } = CONDITION_BOUNDS[key]
  // The on-screen name only: the field's own key never reaches the message.
  const range = conditionBoundMessage(key)
  return z.preprocess(
    value => value === '' || value === undefined ? undefined : value,
    z.coerce.number({ message: `the ${label} must be a number` }).min(min, range).max(max, range).optional(),
  )
}

const fields = z.object({
  vehicleId: z.coerce.number({ message: 'choose the car this log belongs to' }).int().positive('choose the car this log belongs to'),
  mapping: z.string().max(20_000).optional(),
  ambientTempC: optionalNumber('ambientTempC'),
  altitudeM: optionalNumber('altitudeM'),
  baroKpa: optionalNumber('baroKpa'),
  humidityPct: optionalNumber('humidityPct'),
  profileId: z.coerce.number().int().positive().optional(),
  notes: z.string().max(5000).optional(),
  recordedOn: z.string().max(40).superRefine((text, context) => {
    const problem = recordedOnProblem(text)
    if (problem) context.addIssue({ code: 'custom', message: problem })
  }).optional(),
  coreId: z.coerce.number().int().positive().optional(),
  // Several drives in one file: "all" or drive numbers "0,2" (server/utils/drives.ts).
  drives: z.string().max(200).optional(),
})

// Text fields are small (the mapping is the largest, 20 000 characters of up to 4 bytes each).
const FORM_LIMITS = { fileBytes: LOG_UPLOAD_LIMITS.maxBytes, fieldBytes: 96 * 1024, fields: 16 }
const TOO_LARGE = `The file is larger than ${LOG_UPLOAD_LIMITS.maxBytes / 1024 / 1024} MB. Trim the log to the part with the hard pulls, or export fewer channels, and upload again.`

// The body is streamed: fields into memory, the file straight to a temporary file, the byte limit
// enforced while reading. Import and analysis then run in the worker pool; this request only waits.
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const declared = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (declared > LOG_UPLOAD_LIMITS.maxBytes + 1024 * 1024) await refuse(event, 413, TOO_LARGE)
  // Full already: say so before taking in the bytes.
  if (analysisQueueFull()) await refuse(event, 503, BUSY_MESSAGE)

  const form = await receiveMultipart(event, { fileField: 'file', directory: incomingDir(), limits: FORM_LIMITS, tooLargeMessage: TOO_LARGE })
  const temporary = form.file?.path
  try {
    const parsed = fields.safeParse(form.fields)
    if (!parsed.success) badRequest(`The upload form is not valid — ${describeIssues(parsed.error)}. Correct it and try again.`)
    const input = parsed.data

    const vehicle = findVisibleVehicle(actor, input.vehicleId)
    if (!canUploadLog(actor, vehicle)) forbidden('Your role cannot upload logs. Ask a tuner or the workshop owner to upload it, or the customer whose car it is.')
    if (input.coreId !== undefined && !canChangeLogCore(actor)) forbidden('Only the workshop\'s staff record which core was fitted; leave the core out and the car\'s fitted core is used.')
    assertCatalogueCore(actor, input.coreId)

    const file = form.file
    if (!file) badRequest('No file was attached. Choose the log file (.csv, .txt or .log) and send it again.')
    const name = cleanFileName(file.name)
    const problem = checkLogFile(name, file.sizeBytes)
    if (problem) {
      throw createError({ statusCode: file.sizeBytes > LOG_UPLOAD_LIMITS.maxBytes ? 413 : file.sizeBytes === 0 ? 400 : 415, message: problem })
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
      file: { temporaryPath: file.path, sizeBytes: file.sizeBytes, sha256: file.sha256 },
      originalName: name,
      mapping,
      conditions: { ambientTempC: input.ambientTempC, altitudeM: input.altitudeM, baroKpa: input.baroKpa, humidityPct: input.humidityPct },
      notes: input.notes,
      recordedOn: input.recordedOn,
      coreId: input.coreId,
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
  }
  finally {
    // Renamed to its id when stored; anything else leaves no file behind.
    if (temporary) await rm(temporary, { force: true })
  }
})

async function refuse(event: H3Event, statusCode: 413 | 503, message: string): Promise<never> {
  // Not stored, but a declared body up to twice the limit is read and dropped first, so that a
  // client that only reads the answer after sending everything (fetch) gets the 413 or 503 rather
  // than a reset; a larger one is answered at once and the connection closed.
  await dropRestOfBody(event, 2 * LOG_UPLOAD_LIMITS.maxBytes)
  if (statusCode === 503) analysisBusy()
  throw createError({ statusCode, message })
}
