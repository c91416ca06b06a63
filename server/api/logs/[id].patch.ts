import { eq } from 'drizzle-orm'
import { z } from 'zod'
import type { AnalysisResult, PullEdits } from '../../analysis'

// The same bounds and words as the upload form's (shared/utils/conditions.ts); null clears a value.
const condition = (key: ConditionKey) => {
  const { min, max, label } = CONDITION_BOUNDS[key]
  const range = conditionBoundMessage(key)
  return z.number({ message: `the ${label} must be a number` }).min(min, range).max(max, range).nullable().optional()
}

const window = z.object({ startS: z.number().min(0), endS: z.number().min(0) }).refine(w => w.endS > w.startS, 'a pull ends after it starts')

const body = z.object({
  notes: z.string().max(5000).optional(),
  ambientTempC: condition('ambientTempC'),
  altitudeM: condition('altitudeM'),
  baroKpa: condition('baroKpa'),
  humidityPct: condition('humidityPct'),
  pullEdits: z.object({
    add: z.array(window).max(50).optional(),
    remove: z.array(z.number().int().min(0)).max(200).optional(),
    adjust: z.array(z.object({ index: z.number().int().min(0), startS: z.number().min(0).optional(), endS: z.number().min(0).optional() })).max(200).optional(),
    // Issue 10: the full-load rule set by hand, and "keep the pulls left out for a sensor fault".
    rule: z.object({ channel: z.enum(['pedal', 'throttle']).optional(), thresholdPct: z.number().min(1, 'the full-load threshold is between 1 and 100 %').max(100, 'the full-load threshold is between 1 and 100 %'), sustained: z.boolean().optional() }).strict().optional(),
    keepLeftOut: z.boolean().optional(),
  }).strict().optional(),
}).strict()

export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = readParamsWith(event, idParams)
  const { log, vehicle } = findVisibleLog(actor, id)
  if (!canEditLog(actor, vehicle)) forbidden('Your role can read this log but not change it.')
  const changes = await readBodyWith(event, body)
  // The pulls form is for the people who read logs; a customer changes the conditions and notes only.
  if (changes.pullEdits !== undefined && !canEditPulls(actor, vehicle)) {
    forbidden('Your workshop decides which stretches of a log count as pulls. You can change the notes and the conditions (ambient temperature, altitude, barometric pressure, relative humidity).')
  }

  const conditions = { ...log.conditions }
  for (const key of ['ambientTempC', 'altitudeM', 'baroKpa', 'humidityPct'] as const) {
    if (changes[key] !== undefined) conditions[key] = changes[key]
  }
  const pullEdits = (changes.pullEdits ?? log.pullEdits) as PullEdits
  const reanalyse = changes.pullEdits !== undefined || ['ambientTempC', 'altitudeM', 'baroKpa', 'humidityPct'].some(key => key in changes)

  let analysis: AnalysisResult | undefined
  // In the analysis worker pool: a large log must not hold up everyone else's requests.
  if (reanalyse) analysis = await reanalyseStoredLog(log, conditions, vehicle, pullEdits)

  const updated = useDb().transaction((tx) => {
    const row = tx.update(tables.logs).set({
      ...(changes.notes !== undefined ? { notes: changes.notes } : {}),
      conditions: cleanConditions(conditions),
      pullEdits: pullEdits as Record<string, unknown>,
    }).where(eq(tables.logs.id, log.id)).returning().get()
    if (analysis) {
      tx.update(tables.analyses).set({ result: analysis as unknown as Record<string, unknown>, engineVersion: ENGINE_VERSION, createdAt: new Date() }).where(eq(tables.analyses.logId, log.id)).run()
      markComparisonsStale(tx, log.id)
    }
    recordAudit(tx, { workshopId: actor.workshopId, userId: actor.id, action: reanalyse ? 'reanalysed' : 'updated', entity: 'log', entityId: log.id, detail: { fields: Object.keys(changes) } })
    return row
  })
  return logDetail(updated, vehicle)
})
