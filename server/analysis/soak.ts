// Heat soak across a session: how much hotter each pull runs than the one before, how fast the
// core recovers between pulls, and when the soak would cost a given share of power.
import { compressorOutletTempK } from './compressor'
import { KELVIN_OFFSET } from './constants'
import { LogImportError } from './import/errors'
import { fitExponential, linearRegression } from './stats'
import type { PullWindow } from './pulls'

export interface SoakTrend {
  /** Least-squares slope of pull mean charge temperature against pull number, K per pull. */
  soakIndexKPerPull: number | null
  /** Coefficient of determination of that line (how steady the climb is). */
  soakFitR2: number | null
  intercept: number | null
}

/** The soak index: slope of mean charge temperature (°C or K, same slope) against pull number 1…n. */
export function soakTrend(meanChargeTempC: readonly number[]): SoakTrend {
  if (meanChargeTempC.length < 2) return { soakIndexKPerPull: null, soakFitR2: null, intercept: null }
  const numbers = meanChargeTempC.map((_, i) => i + 1)
  const fit = linearRegression(numbers, meanChargeTempC)
  return {
    soakIndexKPerPull: Number.isFinite(fit.slope) ? fit.slope : null,
    soakFitR2: Number.isFinite(fit.r2) ? fit.r2 : null,
    intercept: Number.isFinite(fit.intercept) ? fit.intercept : null,
  }
}

export interface RecoveryFit {
  /** Median time constant of the exponential recovery between pulls, s. */
  recoveryTimeConstantS: number | null
  /** How many gaps between pulls gave a usable fit. */
  fittedGaps: number
}

/** Shortest gap between pulls worth fitting, s (common practice, no source). */
const MIN_GAP_S = 15
/** Time after a pull before the core recovery is fitted, s (common practice, no source). */
const RECOVERY_SETTLE_S = 8
const MAX_FITTED_GAPS = 40

/**
 * Recovery between pulls: after each pull, charge temperature relaxes towards a cruise level;
 * fit T(t) = T∞ + (T0 − T∞)·e^(−t/τ) (first-order lag, Newton's law of cooling; common practice)
 * from the hottest point just after the pull to the next pull. Masked samples are left out.
 */
export function recoveryTimeConstant(timeS: Float64Array, chargeK: Float32Array, flags: Uint8Array, pulls: readonly PullWindow[]): RecoveryFit {
  const taus: number[] = []
  // On very long logs a sample of gaps is enough for a median, and keeps the cost bounded.
  const gaps = pulls.length - 1
  const stride = Math.max(1, Math.ceil(gaps / MAX_FITTED_GAPS))
  for (let k = 0; k + 1 < pulls.length; k += stride) {
    const from = pulls[k]!.endIndex
    const to = pulls[k + 1]!.startIndex
    if (to - from < 8 || timeS[to - 1]! - timeS[from]! < MIN_GAP_S) continue
    // Right after a pull the charge temperature falls fast because boost (and with it the
    // compressor outlet temperature) drops; that is not the core recovering. Fit after that.
    const settleS = Math.max(RECOVERY_SETTLE_S, 0.2 * (timeS[to - 1]! - timeS[from]!))
    let peak = from
    while (peak < to && timeS[peak]! - timeS[from]! < settleS) peak++
    const xs: number[] = []
    const ys: number[] = []
    // At most ~200 points per gap: plenty for a three-parameter fit and cheap on long logs.
    const step = Math.max(1, Math.floor((to - peak) / 200))
    for (let i = peak; i < to; i += step) {
      if (flags[i] !== 0 || !Number.isFinite(chargeK[i]!)) continue
      xs.push(timeS[i]!)
      ys.push(chargeK[i]!)
    }
    if (xs.length < 6) continue
    const fit = fitExponential(xs, ys)
    if (!fit || !fit.converged || !(fit.r2 > 0.5)) continue
    // Only a cooling curve is a recovery.
    if (!(fit.initial > fit.asymptote) || !(fit.timeConstant > 0)) continue
    taus.push(fit.timeConstant)
  }
  if (taus.length === 0) return { recoveryTimeConstantS: null, fittedGaps: 0 }
  taus.sort((a, b) => a - b)
  const mid = taus.length >> 1
  const median = taus.length % 2 ? taus[mid]! : (taus[mid - 1]! + taus[mid]!) / 2
  return { recoveryTimeConstantS: median, fittedGaps: taus.length }
}

export interface SoakProjection {
  /** The loss against the coolest pull the projection looks for, %. */
  lossPct: number
  /** Pull number (1 = first of the log) at which the trend reaches that loss; null if it does not within the horizon. */
  atPullNumber: number | null
  /** Pulls still to go after the last logged one (0 = already reached). */
  morePulls: number | null
  /** What the projection assumes, for display next to it. */
  assumption: string
}

/** Projection horizon: beyond this many pulls a linear trend means nothing (common practice). */
export const PROJECTION_HORIZON_PULLS = 50

/**
 * Pulls until the density-law loss against the coolest pull reaches `lossPct`:
 * loss = 1 − T_cool/T_k (ideal gas at equal boost, reference sheet §7) with
 * T_k = intercept + slope·k from the soak trend, so T_k ≥ T_cool/(1 − loss).
 */
export function projectPullsUntilLoss(trend: SoakTrend, coolestMeanChargeTempC: number, pullCount: number, lossPct: number): SoakProjection {
  const assumption = 'Straight-line continuation of the pull-to-pull climb, same boost, air-limited engine (density law: an upper bound on the loss).'
  const { soakIndexKPerPull: slope, intercept } = trend
  if (slope === null || intercept === null || !(slope > 0.05) || !Number.isFinite(coolestMeanChargeTempC)) {
    return { lossPct, atPullNumber: null, morePulls: null, assumption }
  }
  const coolK = coolestMeanChargeTempC + KELVIN_OFFSET
  const neededK = coolK / (1 - lossPct / 100)
  const k = (neededK - KELVIN_OFFSET - intercept) / slope
  const atPullNumber = Math.max(1, Math.ceil(k - 1e-9))
  if (atPullNumber > PROJECTION_HORIZON_PULLS) return { lossPct, atPullNumber: null, morePulls: null, assumption }
  return { lossPct, atPullNumber, morePulls: Math.max(0, atPullNumber - pullCount), assumption }
}

export interface NormaliseInput {
  chargeK: number
  ambientK: number
  /** The pull's pressure ratio; NaN when boost is not usable (then only ambient is allowed for). */
  pressureRatio: number
  refAmbientK: number
  refPressureRatio: number
  efficiency: number
}

/**
 * The charge temperature a pull would have had at a reference ambient and pressure ratio.
 * Physics: the intercooler leaves a share (1 − ε) of the compressor's temperature rise in the
 * charge (ε = hot-side effectiveness, reference sheet §5), and the compressor's rise over ambient
 * is T1·(PR^((γ−1)/γ) − 1)/η (reference sheet §4). Holding (1 − ε) — the state of the core — and
 * swapping the conditions gives
 *   T_n = T_ref + (T_charge − T_amb) · ΔT2(T_ref, PR_ref) / ΔT2(T_amb, PR).
 * Without a usable pressure ratio only the ambient is swapped: T_n = T_ref + (T_charge − T_amb).
 * The compressor efficiency cancels in the ratio except through its (shared) value.
 */
export function normalisedChargeTempK(input: NormaliseInput): number {
  const { chargeK, ambientK, pressureRatio, refAmbientK, refPressureRatio, efficiency } = input
  for (const [name, value] of [['charge temperature', chargeK], ['ambient temperature', ambientK], ['reference ambient', refAmbientK]] as const) {
    if (!(value > 0) || !Number.isFinite(value)) throw new LogImportError('IMPOSSIBLE_INPUT', `Cannot restate the charge temperature: the ${name} must be a positive absolute temperature in kelvin; got ${String(value)}.`)
  }
  const over = chargeK - ambientK
  if (!(pressureRatio > 1) || !(refPressureRatio > 1)) return refAmbientK + over
  const rise = compressorOutletTempK(ambientK, pressureRatio, efficiency) - ambientK
  const refRise = compressorOutletTempK(refAmbientK, refPressureRatio, efficiency) - refAmbientK
  return refAmbientK + over * refRise / rise
}
