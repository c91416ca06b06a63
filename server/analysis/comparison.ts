// Before-vs-after comparison of per-pull values (effectiveness, ΔT over ambient): mean ± Student-t
// confidence interval per side, and the difference (after − before) with a Welch interval
// (Welch 1947; Satterthwaite 1946 degrees of freedom), which does not assume equal variances.
import { confidenceInterval, studentTQuantile, type ConfidenceInterval } from './stats'

export interface DifferenceInterval {
  /** after − before */
  mean: number
  standardError: number
  /** Welch–Satterthwaite degrees of freedom (not an integer in general) */
  df: number
  halfWidth: number
  low: number
  high: number
  level: number
}

export interface SampleComparison {
  before: ConfidenceInterval
  after: ConfidenceInterval
  difference: DifferenceInterval
  /** the two confidence intervals do not overlap (a plain, conservative flag) */
  intervalsSeparate: boolean
  /** the Welch interval of the difference excludes zero */
  differenceExcludesZero: boolean
}

function finite(values: ArrayLike<number>): number[] {
  const out: number[] = []
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!
    if (Number.isFinite(v)) out.push(v)
  }
  return out
}

/**
 * Welch interval for mean(after) − mean(before):
 * SE² = s₁²/n₁ + s₂²/n₂, ν = SE⁴/[(s₁²/n₁)²/(n₁−1) + (s₂²/n₂)²/(n₂−1)], half-width t(1−α/2, ν)·SE.
 */
export function welchDifference(before: ArrayLike<number>, after: ArrayLike<number>, level = 0.95): DifferenceInterval {
  const a = confidenceInterval(finite(before), level)
  const b = confidenceInterval(finite(after), level)
  const va = a.sd * a.sd / a.n
  const vb = b.sd * b.sd / b.n
  const standardError = Math.sqrt(va + vb)
  const mean = b.mean - a.mean
  let df = (va + vb) ** 2 / (va * va / (a.n - 1) + vb * vb / (b.n - 1))
  // Both samples without spread: the interval collapses to a point (df is 0/0).
  if (standardError === 0) df = a.n + b.n - 2
  const halfWidth = standardError === 0 ? 0 : studentTQuantile(1 - (1 - level) / 2, df) * standardError
  return { mean, standardError, df, halfWidth, low: mean - halfWidth, high: mean + halfWidth, level }
}

/**
 * Compare two samples. Non-finite values (pulls where the quantity was undefined) are dropped;
 * each side needs at least 2 values for an interval, otherwise the interval fields are NaN and
 * both flags are false.
 */
export function compareSamples(before: ArrayLike<number>, after: ArrayLike<number>, level = 0.95): SampleComparison {
  const b = confidenceInterval(finite(before), level)
  const a = confidenceInterval(finite(after), level)
  const difference = welchDifference(before, after, level)
  return {
    before: b,
    after: a,
    difference,
    intervalsSeparate: b.high < a.low || a.high < b.low,
    differenceExcludesZero: difference.low > 0 || difference.high < 0,
  }
}

export interface PullValues {
  effectiveness: ArrayLike<number>
  deltaOverAmbientK: ArrayLike<number>
}

export interface BeforeAfterComparison {
  effectiveness: SampleComparison
  deltaOverAmbientK: SampleComparison
}

/** The comparison issue's two quantities, each compared before vs after. */
export function compareBeforeAfter(before: PullValues, after: PullValues, level = 0.95): BeforeAfterComparison {
  return {
    effectiveness: compareSamples(before.effectiveness, after.effectiveness, level),
    deltaOverAmbientK: compareSamples(before.deltaOverAmbientK, after.deltaOverAmbientK, level),
  }
}

/**
 * Ambient temperatures closer than this are treated as comparable days. Common practice, no
 * source: effectiveness is fairly insensitive to ambient, ΔT over ambient less so.
 */
export const AMBIENT_TOLERANCE_K = 3

export interface AmbientCheck {
  comparable: boolean
  /** after − before, K */
  differenceK: number
  toleranceK: number
}

/** Are two logs' mean ambient temperatures close enough to compare them directly? */
export function ambientComparable(ambientBeforeK: number, ambientAfterK: number, toleranceK = AMBIENT_TOLERANCE_K): AmbientCheck {
  const differenceK = ambientAfterK - ambientBeforeK
  return { comparable: Math.abs(differenceK) <= toleranceK, differenceK, toleranceK }
}
