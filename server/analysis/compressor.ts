// Compressor outlet temperature from pressure ratio and isentropic efficiency.
// Standard ideal-gas relation, e.g. Heywood, Internal Combustion Engine Fundamentals (1988) ch. 6,
// and Watson & Janota, Turbocharging the Internal Combustion Engine (1982); section numbers from
// memory, the formula itself confirmed (reference sheet §4).
import { GAMMA_AIR, KELVIN_OFFSET } from './constants'
import { impossible, requireBetween, requirePositive } from './guard'

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
  requirePositive('The compressor inlet temperature', t1K, 'K')
  requirePositive('The pressure ratio', pressureRatio, '')
  requireBetween('The compressor efficiency', efficiency, 0, 1)
  if (efficiency === 0) impossible('The compressor efficiency must be above 0.')
  return t1K * (1 + (temperatureRatioIsentropic(pressureRatio, gamma) - 1) / efficiency)
}

/**
 * Isentropic efficiency backed out of a measured outlet temperature:
 * η = T1·(PR^((γ−1)/γ) − 1)/(T2 − T1). Throws when T2 ≤ T1 (no temperature rise measured, so
 * the sensor is not after a working compressor). Useful to sanity-check sensor placement.
 */
export function compressorEfficiencyFromTemps(t1K: number, t2K: number, pressureRatio: number, gamma = GAMMA_AIR): number {
  requirePositive('The compressor inlet temperature', t1K, 'K')
  requirePositive('The pressure ratio', pressureRatio, '')
  const riseK = t2K - t1K
  if (!(riseK > 0)) impossible(`The temperature after the compressor (${(t2K - KELVIN_OFFSET).toFixed(1)} °C) is not above the inlet (${(t1K - KELVIN_OFFSET).toFixed(1)} °C), so no efficiency can be worked out: is that sensor really after the compressor?`)
  return t1K * (temperatureRatioIsentropic(pressureRatio, gamma) - 1) / riseK
}

/** Pressure ratio across the compressor from absolute outlet and inlet pressure. */
export function pressureRatio(outletPressurePa: number, inletPressurePa: number): number {
  return outletPressurePa / inletPressurePa
}
