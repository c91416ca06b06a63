// ε-NTU for a single-pass crossflow heat exchanger with both streams unmixed (an air-to-air
// intercooler core), plus the charge mass-flow estimates needed to use it.
//
// Definitions (Incropera, DeWitt, Bergman & Lavine, Fundamentals of Heat and Mass Transfer,
// 6th ed. 2007, §11.4; section from memory): C = ṁ·c_p, Cr = C_min/C_max, NTU = UA/C_min,
// Q = ε·C_min·(T_h,in − T_c,in).
import { CP_AIR, P0_PA, R_DRY_AIR } from './constants'
import { dryAirDensity } from './density'
import { impossible, requireBetween, requirePositive } from './guard'

export type EntuForm = 'exact' | 'approx'

/** Largest NTU searched by the inverse; beyond it an air-to-air core is not plausible. */
export const NTU_MAX = 50

// Upper tails of the Poisson distribution, P(n+1, x) = Σ_{m>n} e^(−x)·x^m/m! for n = 0…, which
// equal the regularized lower incomplete gamma P(n+1, x) = 1 − e^(−x)·Σ_{m≤n} x^m/m!. Summed from
// the far tail downwards so small tails keep full relative precision (the textbook form
// 1 − e^(−x)·Σ cancels to nothing long before a term reaches 1e-18).
function incompleteGammaTails(x: number): Float64Array {
  const last = Math.ceil(x + 12 * Math.sqrt(x) + 40)
  const pmf = new Float64Array(last + 1)
  let lnP = -x
  for (let m = 0; m <= last; m++) {
    if (m > 0) lnP += Math.log(x) - Math.log(m)
    pmf[m] = Math.exp(lnP)
  }
  const tails = new Float64Array(last + 1)
  let acc = 0
  for (let m = last; m >= 1; m--) {
    acc += pmf[m]!
    tails[m - 1] = acc // tails[n] = P(n+1, x)
  }
  return tails
}

/**
 * Exact effectiveness, crossflow, both unmixed (Mason 1954; Kays & London, Compact Heat
 * Exchangers 3rd ed. 1984; Shah & Sekulić 2003 Table 3.3 — citations from memory, the series was
 * confirmed numerically against the Triboix 2009 integral form, reference sheet §6.1):
 * ε = 1/(Cr·NTU) · Σ_{n≥0} P(n+1, NTU)·P(n+1, Cr·NTU), stopped when a term falls below 1e-18.
 * Cr = 0 (one stream with infinite capacity) has the limit ε = 1 − e^(−NTU).
 */
export function crossflowUnmixedExact(ntu: number, cr: number): number {
  if (!(ntu > 0)) return 0
  // Below 1e-100 the Cr correction is far below double precision, and Cr·NTU may underflow to 0.
  if (cr * ntu < 1e-100) return -Math.expm1(-ntu)
  const a = incompleteGammaTails(ntu)
  const b = incompleteGammaTails(cr * ntu)
  const terms = Math.min(a.length, b.length)
  let sum = 0
  for (let n = 0; n < terms; n++) {
    const term = a[n]! * b[n]!
    sum += term
    if (term < 1e-18) break
  }
  return sum / (cr * ntu)
}

/**
 * Common closed-form approximation, ε ≈ 1 − exp[(1/Cr)·NTU^0.22·(exp(−Cr·NTU^0.78) − 1)]
 * (Incropera et al. 6th ed. Table 11.3, Eq. 11.32 — numbers from memory; formula confirmed in the
 * `ht` library docstring). Within about 0.011 of the exact value for NTU 0.1–5, Cr 0.05–1.
 * Cr = 0 is special-cased because the formula divides by Cr.
 */
export function crossflowUnmixedApprox(ntu: number, cr: number): number {
  if (!(ntu > 0)) return 0
  if (cr < 1e-100) return -Math.expm1(-ntu)
  return -Math.expm1(Math.pow(ntu, 0.22) * Math.expm1(-cr * Math.pow(ntu, 0.78)) / cr)
}

export function crossflowEffectiveness(ntu: number, cr: number, form: EntuForm = 'exact'): number {
  return form === 'exact' ? crossflowUnmixedExact(ntu, cr) : crossflowUnmixedApprox(ntu, cr)
}

/**
 * Counterflow, the best any two-stream arrangement can do (Incropera Table 11.3, from memory;
 * confirmed in `ht`): ε = (1 − e^(−NTU(1−Cr)))/(1 − Cr·e^(−NTU(1−Cr))), NTU/(1+NTU) at Cr = 1.
 */
export function counterflowEffectiveness(ntu: number, cr: number): number {
  if (!(ntu > 0)) return 0
  if (Math.abs(1 - cr) < 1e-12) return ntu / (1 + ntu)
  const e = Math.exp(-ntu * (1 - cr))
  return (1 - e) / (1 - cr * e)
}

/**
 * NTU that gives effectiveness `eps` at capacity ratio `cr`: bracketed (doubling) then
 * bisected, since ε rises monotonically with NTU. Returns 0 for eps ≤ 0 and throws when eps is
 * not reached below NTU_MAX (for an air-to-air core that points at a measurement problem).
 */
export function ntuForEffectiveness(eps: number, cr: number, form: EntuForm = 'exact'): number {
  if (typeof eps !== 'number' || Number.isNaN(eps)) impossible(`The effectiveness must be a number; got ${String(eps)}.`)
  requireBetween('The capacity ratio', cr, 0, 1)
  if (!(eps > 0)) return 0
  const f = (ntu: number) => crossflowEffectiveness(ntu, cr, form) - eps
  let lo = 0
  let hi = 0.5
  while (f(hi) < 0) {
    lo = hi
    hi *= 2
    if (hi > NTU_MAX) {
      if (f(NTU_MAX) < 0) impossible(`An effectiveness of ${eps.toFixed(3)} is not reached by a crossflow core at a capacity ratio of ${cr.toFixed(2)} (not even at ${NTU_MAX} transfer units): the measurement or the flow estimate is off.`)
      hi = NTU_MAX
      break
    }
  }
  for (let i = 0; i < 200 && hi - lo > 1e-12; i++) {
    const mid = 0.5 * (lo + hi)
    if (f(mid) < 0) lo = mid
    else hi = mid
  }
  return 0.5 * (lo + hi)
}

export interface CapacityRates {
  /** charge (hot) side, W/K */
  hotWK: number
  /** cooling-air (cold) side, W/K */
  coldWK: number
  minWK: number
  maxWK: number
  /** Cr = C_min/C_max */
  cr: number
  /** true when the charge air is the C_min stream (then hot-side ε equals the true ε) */
  hotIsMin: boolean
}

export function capacityRates({ hotMassFlowKgS, coldMassFlowKgS, cpHot = CP_AIR, cpCold = CP_AIR }: {
  hotMassFlowKgS: number
  coldMassFlowKgS: number
  cpHot?: number
  cpCold?: number
}): CapacityRates {
  const hotWK = hotMassFlowKgS * cpHot
  const coldWK = coldMassFlowKgS * cpCold
  const minWK = Math.min(hotWK, coldWK)
  const maxWK = Math.max(hotWK, coldWK)
  return { hotWK, coldWK, minWK, maxWK, cr: maxWK > 0 ? minWK / maxWK : 0, hotIsMin: hotWK <= coldWK }
}

export interface UaCalibration {
  /** overall conductance, W/K */
  ua: number
  ntu: number
  cr: number
  /** true ε-NTU effectiveness (differs from the hot-side value when the cooling air is C_min) */
  effectiveness: number
  rates: CapacityRates
  assumptions: string[]
}

/**
 * UA from a log: the trade (hot-side) effectiveness P_h = (T_pre − T_charge)/(T_pre − T_amb)
 * converts to the true ε = P_h·C_h/C_min (energy balance), then NTU from the crossflow relation,
 * then UA = NTU·C_min. Impossible input (ε outside 0…1, no flow, an ε the flows cannot reach) throws
 * an IMPOSSIBLE_INPUT error saying what is wrong.
 */
export function calibrateUa({ effectiveness, chargeMassFlowKgS, coolingMassFlowKgS, form = 'exact' }: {
  effectiveness: number
  chargeMassFlowKgS: number
  coolingMassFlowKgS: number
  form?: EntuForm
}): UaCalibration {
  requireBetween('The measured effectiveness', effectiveness, 0, 1, true)
  requirePositive('The charge-air mass flow', chargeMassFlowKgS, 'kg/s')
  requirePositive('The cooling-air mass flow', coolingMassFlowKgS, 'kg/s')
  const rates = capacityRates({ hotMassFlowKgS: chargeMassFlowKgS, coldMassFlowKgS: coolingMassFlowKgS })
  const trueEps = effectiveness * rates.hotWK / rates.minWK
  if (!(trueEps < 1)) {
    impossible(`An effectiveness of ${effectiveness.toFixed(3)} cannot be reached with ${coolingMassFlowKgS} kg/s of cooling air for ${chargeMassFlowKgS} kg/s of charge air: the cooling air would have to leave hotter than the charge came in. Check the cooling-air flow estimate.`)
  }
  const ntu = ntuForEffectiveness(trueEps, rates.cr, form)
  return {
    ua: ntu * rates.minWK,
    ntu,
    cr: rates.cr,
    effectiveness: trueEps,
    rates,
    assumptions: [
      'Single-pass crossflow, both streams unmixed.',
      `Specific heat of air ${CP_AIR} J/(kg·K) on both sides (common practice).`,
      'The measured hot-side effectiveness is a steady-state value (heat stored in the core ignored).',
      'Cooling-air mass flow through the core is an estimate; UA scales with it.',
    ],
  }
}

export interface CalibratedCore {
  ua: number
  faceAreaM2: number
  depthM: number
}

export interface PredictCoreInput {
  /** UA of the candidate, W/K; or give `calibratedFrom` plus `depthM` to scale one */
  ua?: number
  calibratedFrom?: CalibratedCore
  depthM?: number
  chargeMassFlowKgS: number
  /** cooling-air speed through the core face, m/s */
  coolingAirSpeedMS: number
  faceAreaM2: number
  chargeInK: number
  ambientK: number
  /** cooling-air density; default ρ = p/(R·T) at the ambient temperature and `ambientPressurePa` */
  coolingAirDensityKgM3?: number
  ambientPressurePa?: number
  form?: EntuForm
}

export interface CorePrediction {
  ua: number
  ntu: number
  cr: number
  /** true ε-NTU effectiveness */
  effectiveness: number
  /** trade (hot-side) effectiveness, comparable with a log's measured value */
  chargeSideEffectiveness: number
  heatDutyW: number
  chargeOutK: number
  coolingOutK: number
  rates: CapacityRates
  assumptions: string[]
}

/**
 * Outlet temperature, ε and heat duty of a candidate core. When UA is scaled from a calibrated
 * core, UA ∝ face area × depth: a MODEL ASSUMPTION (same fin and tube geometry and density, so
 * heat-transfer area scales with core volume, and unchanged heat-transfer coefficients, which in
 * reality vary with air velocity). Quotes built on this are estimates and say so.
 */
export function predictCore(input: PredictCoreInput): CorePrediction {
  const assumptions = [
    'Single-pass crossflow, both streams unmixed.',
    `Specific heat of air ${CP_AIR} J/(kg·K) on both sides (common practice).`,
    'Steady state: no heat stored in the core (no heat soak).',
  ]
  let ua: number
  if (input.ua !== undefined) {
    ua = input.ua
  }
  else if (input.calibratedFrom && input.depthM !== undefined) {
    const ref = input.calibratedFrom
    ua = ref.ua * (input.faceAreaM2 / ref.faceAreaM2) * (input.depthM / ref.depthM)
    assumptions.push(
      'UA scaled from a calibrated core by face area × depth (model assumption: same fin/tube geometry and density).',
      'Heat-transfer coefficients taken as in the calibration; in reality they change with air speed through the core.',
    )
  }
  else {
    throw new RangeError('predictCore needs either ua, or calibratedFrom together with depthM')
  }
  let rho = input.coolingAirDensityKgM3
  if (rho === undefined) {
    rho = dryAirDensity(input.ambientPressurePa ?? P0_PA, input.ambientK, R_DRY_AIR)
    assumptions.push('Cooling-air density from the ideal-gas law at ambient temperature (dry air).')
  }
  const coolingMassFlowKgS = rho * input.coolingAirSpeedMS * input.faceAreaM2
  const rates = capacityRates({ hotMassFlowKgS: input.chargeMassFlowKgS, coldMassFlowKgS: coolingMassFlowKgS })
  const ntu = rates.minWK > 0 ? ua / rates.minWK : 0
  const effectiveness = crossflowEffectiveness(ntu, rates.cr, input.form ?? 'exact')
  const heatDutyW = effectiveness * rates.minWK * (input.chargeInK - input.ambientK)
  const chargeOutK = input.chargeInK - heatDutyW / rates.hotWK
  return {
    ua,
    ntu,
    cr: rates.cr,
    effectiveness,
    chargeSideEffectiveness: effectiveness * rates.minWK / rates.hotWK,
    heatDutyW,
    chargeOutK,
    coolingOutK: input.ambientK + heatDutyW / rates.coldWK,
    rates,
    assumptions,
  }
}

/**
 * Speed-density air mass flow, ṁ = η_v·ρ_man·V_d·N/(60·n_R), ρ_man = MAP/(R·IAT), n_R = 2 for a
 * four-stroke (Heywood 1988 §2.10, section from memory). η_v referenced to manifold conditions.
 */
export function massFlowSpeedDensity({ displacementL, rpm, mapPa, iatK, volumetricEfficiency, strokes = 4 }: {
  displacementL: number
  rpm: number
  mapPa: number
  iatK: number
  volumetricEfficiency: number
  strokes?: 2 | 4
}): number {
  const revolutionsPerCycle = strokes / 2
  return volumetricEfficiency * dryAirDensity(mapPa, iatK) * (displacementL / 1000) * rpm / (60 * revolutionsPerCycle)
}

/**
 * Air mass flow from power: ṁ_fuel = P·BSFC, ṁ_air = ṁ_fuel·λ·AFR_stoich (definition of BSFC and
 * λ; reference sheet §8.1). BSFC in kg/kWh; result in kg/s. AFR 14.7 for petrol is common practice.
 */
export function massFlowFromPower({ powerKw, bsfc, afrStoich = 14.7, lambda = 1 }: {
  powerKw: number
  /** kg/kWh */
  bsfc: number
  afrStoich?: number
  lambda?: number
}): number {
  return powerKw * bsfc * lambda * afrStoich / 3600
}

/**
 * Stoichiometric air/fuel ratio of a hydrocarbon CH_y, (A/F)_s = 34.56·(4 + y)/(12.011 + 1.008·y)
 * (Heywood 1988 eq. 3.4, from memory).
 */
export function stoichiometricAfr(hydrogenCarbonRatio: number): number {
  return 34.56 * (4 + hydrogenCarbonRatio) / (12.011 + 1.008 * hydrogenCarbonRatio)
}
