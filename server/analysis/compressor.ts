// Compressor outlet temperature from pressure ratio and isentropic efficiency.
// Standard ideal-gas relation, e.g. Heywood, Internal Combustion Engine Fundamentals (1988) ch. 6,
// and Watson & Janota, Turbocharging the Internal Combustion Engine (1982); section numbers from
// memory, the formula itself confirmed (reference sheet §4).
import { GAMMA_AIR } from './constants'

/**
 * Default total-to-total isentropic efficiency. Common practice, no source: automotive
 * centrifugal compressors run about 0.65–0.78 across the useful map.
 */
export const DEFAULT_COMPRESSOR_EFFICIENCY = 0.70

function temperatureRatioIsentropic(pressureRatio: number, gamma: number): number {
  return Math.pow(pressureRatio, (gamma - 1) / gamma)
}

/** T2s = T1·PR^((γ−1)/γ) (isentropic outlet temperature). */
export function isentropicOutletTempK(t1K: number, pressureRatio: number, gamma = GAMMA_AIR): number {
  return t1K * temperatureRatioIsentropic(pressureRatio, gamma)
}

/** T2 = T1·[1 + (PR^((γ−1)/γ) − 1)/η] (actual outlet temperature). */
export function compressorOutletTempK(t1K: number, pressureRatio: number, efficiency = DEFAULT_COMPRESSOR_EFFICIENCY, gamma = GAMMA_AIR): number {
  return t1K * (1 + (temperatureRatioIsentropic(pressureRatio, gamma) - 1) / efficiency)
}

/**
 * Isentropic efficiency backed out of a measured outlet temperature:
 * η = T1·(PR^((γ−1)/γ) − 1)/(T2 − T1). NaN when T2 ≤ T1 (no temperature rise measured, so
 * the sensor is not after a working compressor). Useful to sanity-check sensor placement.
 */
export function compressorEfficiencyFromTemps(t1K: number, t2K: number, pressureRatio: number, gamma = GAMMA_AIR): number {
  const riseK = t2K - t1K
  if (!(riseK > 0)) return Number.NaN
  return t1K * (temperatureRatioIsentropic(pressureRatio, gamma) - 1) / riseK
}

/** Pressure ratio across the compressor from absolute outlet and inlet pressure. */
export function pressureRatio(outletPressurePa: number, inletPressurePa: number): number {
  return outletPressurePa / inletPressurePa
}
