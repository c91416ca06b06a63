// Power change with charge-air temperature at fixed manifold pressure (reference sheet §7).
// At fixed MAP, VE and AFR the trapped air mass follows ρ = p/(R·T), so P_hot/P_cool = (T_cool/T_hot)^k.

/**
 * 'density': k = 1, ideal-gas density law; an upper bound on the loss (real engines are partly
 *   compensated by VE, knock and boost control).
 * 'sqrt':    k = 0.5, the temperature exponent of SAE J1349 (from memory); conservative.
 * 'iso':     k = 0.6, the temperature exponent of ISO 1585 spark ignition (from memory).
 */
export type PowerLaw = 'density' | 'sqrt' | 'iso'

export const POWER_LAW_EXPONENT: Record<PowerLaw, number> = {
  density: 1,
  sqrt: 0.5,
  iso: 0.6,
}

/**
 * Power lost, %, when the charge is at `hotK` instead of `coolK` (both absolute, kelvin), same
 * boost, air-limited: 100·(1 − (T_cool/T_hot)^k). Negative when `hotK` is actually cooler.
 */
export function powerLossPct(coolK: number, hotK: number, law: PowerLaw = 'density'): number {
  return 100 * (1 - Math.pow(coolK / hotK, POWER_LAW_EXPONENT[law]))
}

/** Power lost, kW, from a baseline power at the cool charge temperature. */
export function powerLossKw(basePowerKw: number, coolK: number, hotK: number, law: PowerLaw = 'density'): number {
  return basePowerKw * powerLossPct(coolK, hotK, law) / 100
}

/**
 * Linearised density law: percent power per kelvin at a charge temperature, 100/T
 * (dρ/ρ = −dT/T). Near 300 K this is 0.333 %/K.
 */
export function lossPctPerKelvin(tK: number): number {
  return 100 / tK
}

/**
 * The trade rule "about 1 % power per 3 K near 300 K". COMMON PRACTICE, no source; it is the
 * linearised density law above at 300 K and is only shown as a quick estimate.
 */
export function ruleOfThumbLossPct(deltaK: number): number {
  return deltaK / 3
}
