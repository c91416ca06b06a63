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
