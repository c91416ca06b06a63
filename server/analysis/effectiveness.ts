// Intercooler effectiveness as used in the trade: the hot-side temperature effectiveness
// ε = (T_in − T_out)/(T_in − T_ambient) (Shah & Sekulić 2003 ch. 3 call it P, from memory;
// reference sheet §5). Equals the ε-NTU effectiveness only when the charge air is the C_min stream.

/**
 * Smallest (pre-cooler − ambient) span, K, for which the ratio is reported. Common practice, no
 * source: below about 1 K (typical thermocouple/thermistor tolerance) the ratio is noise.
 */
export const MIN_EFFECTIVENESS_SPAN_K = 1

/**
 * ε = (T_pre − T_charge)/(T_pre − T_ambient). Returns NaN when the denominator is below
 * `minSpanK` in magnitude (engine barely boosting, or pre-cooler and ambient equal), because
 * the ratio is then undefined or dominated by sensor noise. Not clamped: heat soak can give
 * ε < 0 (charge hotter than the compressor outlet), and the caller should see that.
 */
export function intercoolerEffectiveness(preK: number, chargeK: number, ambientK: number, minSpanK = MIN_EFFECTIVENESS_SPAN_K): number {
  const spanK = preK - ambientK
  if (!(Math.abs(spanK) >= minSpanK)) return Number.NaN
  return (preK - chargeK) / spanK
}

/** Inverse of the definition: T_charge = T_pre − ε·(T_pre − T_ambient). */
export function chargeTempFromEffectiveness(preK: number, ambientK: number, effectiveness: number): number {
  return preK - effectiveness * (preK - ambientK)
}
