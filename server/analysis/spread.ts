// Median and spread of a workshop's own measurements (the evidence per core).

/**
 * Percentile by linear interpolation between closest ranks (Hyndman & Fan 1996 type 7, the
 * default of R's quantile() and NumPy's percentile). NaN for an empty list.
 */
export function percentile(values: readonly number[], p: number): number {
  const sorted = values.filter(Number.isFinite).sort((a, b) => a - b)
  if (!sorted.length) return Number.NaN
  const h = (sorted.length - 1) * p
  const lo = Math.floor(h)
  const hi = Math.min(lo + 1, sorted.length - 1)
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!)
}

export interface Spread {
  median: number | null
  p10: number | null
  p90: number | null
}

export function spreadOf(values: readonly number[]): Spread {
  const f = (p: number) => {
    const v = percentile(values, p)
    return Number.isFinite(v) ? v : null
  }
  return { median: f(0.5), p10: f(0.1), p90: f(0.9) }
}
