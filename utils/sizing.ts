// Pure helpers of the sizing page.

interface CoreSize { id: number, faceWidthMm: number, faceHeightMm: number, depthMm: number }

const volume = (core: CoreSize) => core.faceWidthMm * core.faceHeightMm * core.depthMm

/** Cores larger (face area × depth) than the one fitted when the log was made; all of them when that core is unknown. */
export function defaultCandidateIds(cores: CoreSize[], fitted: CoreSize | null | undefined): number[] {
  if (!fitted) return cores.map(core => core.id)
  return cores.filter(core => core.id !== fitted.id && volume(core) > volume(fitted)).map(core => core.id)
}

/** The link that starts a quote from a sizing (the quotes page reads these three). */
export function quoteLink(vehicleId: number, sizingId: number, coreId: number): string {
  return `/quotes/new?vehicleId=${vehicleId}&sizingId=${sizingId}&coreId=${coreId}`
}

/** A number field's value for the API: empty means "not given". */
export function optionalNumber(value: number | string | null | undefined): number | undefined {
  if (value === null || value === undefined || value === '') return undefined
  const n = Number(value)
  return Number.isFinite(n) ? n : undefined
}

/** The part of a core's evidence (GET /api/cores/:id/evidence) the sizing page shows beside a prediction. */
interface EvidenceSummary {
  logCount: number
  measuredPullCount: number
  effectiveness: { median: number | null, p10: number | null, p90: number | null }
  vehicles: unknown[]
}

/**
 * What the workshop measured with a core, in a few words: the median effectiveness over every pull
 * logged with it with a pre-cooler sensor, the spread when there are enough pulls, and how many
 * pulls, logs and cars it rests on. Null when nothing was measured with it.
 */
export function measuredText(evidence: EvidenceSummary | null | undefined): string | null {
  if (!evidence || !evidence.measuredPullCount || evidence.effectiveness.median == null) return null
  const pct = (v: number) => `${Math.round(v * 100)} %`
  const { median, p10, p90 } = evidence.effectiveness
  const spread = evidence.measuredPullCount >= 3 && p10 != null && p90 != null && Math.round(p10 * 100) !== Math.round(p90 * 100)
    ? ` (${Math.round(p10 * 100)}–${pct(p90)})`
    : ''
  const cars = evidence.vehicles.length
  return `${pct(median)}${spread} over ${evidence.measuredPullCount} pull${evidence.measuredPullCount === 1 ? '' : 's'}, ${evidence.logCount} log${evidence.logCount === 1 ? '' : 's'}, ${cars} car${cars === 1 ? '' : 's'}`
}
