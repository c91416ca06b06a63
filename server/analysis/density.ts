// Air density: dry ideal gas, humid air by partial pressures, and the vapour carried into the
// charge by the compressor.
import {
  KELVIN_OFFSET,
  MOLAR_MASS_RATIO_AIR_WATER,
  MOLAR_MASS_RATIO_WATER_AIR,
  R_DRY_AIR,
  RHO0_KG_M3,
} from './constants'

/** Dry air as an ideal gas, ρ = p/(R·T) (ISO 2533 formula (14); R_DRY_AIR from ISO 2533). */
export function dryAirDensity(pPa: number, tK: number, gasConstant = R_DRY_AIR): number {
  return pPa / (gasConstant * tK)
}

/**
 * Density relative to ISA sea level, σ = ρ/1.225 with ρ = p/(R·T) (reference sheet §5).
 * The analysis reports this for the charge air after the intercooler.
 */
export function densityRatioIsa(pPa: number, tK: number): number {
  return dryAirDensity(pPa, tK) / RHO0_KG_M3
}

/**
 * Density ratio between two states on absolute pressure and temperature,
 * ρ/ρ_base = (p/p_base)·(T_base/T) (ideal gas, reference sheet §5).
 */
export function densityRatio(pPa: number, tK: number, basePressurePa: number, baseTempK: number): number {
  return (pPa / basePressurePa) * (baseTempK / tK)
}

/**
 * Pressure part of the density change across an intercooler, (p_in − Δp)/p_in
 * (ideal gas at equal temperature; reference sheet §9, check DP-10).
 */
export function pressureDropDensityFactor(inletPressurePa: number, pressureDropPa: number): number {
  return (inletPressurePa - pressureDropPa) / inletPressurePa
}

/**
 * Saturation vapour pressure over liquid water (t > 0.01 °C) or ice (t ≤ 0.01 °C), Pa.
 * Hyland–Wexler (1983) as given in ASHRAE Handbook Fundamentals 2017 ch. 1 eq. 5 (ice) and
 * eq. 6 (water); valid −100…200 °C. The branch switch at the triple point follows the same
 * convention as the psychrolib package, which the tests use as the independent implementation.
 */
export function saturationVapourPressurePa(tC: number): number {
  const tK = tC + KELVIN_OFFSET
  let lnP: number
  if (tC <= 0.01) {
    lnP = -5.6745359e3 / tK + 6.3925247 - 9.677843e-3 * tK + 6.2215701e-7 * tK * tK
      + 2.0747825e-9 * tK ** 3 - 9.484024e-13 * tK ** 4 + 4.1635019 * Math.log(tK)
  }
  else {
    lnP = -5.8002206e3 / tK + 1.3914993 - 4.8640239e-2 * tK + 4.1764768e-5 * tK * tK
      - 1.4452093e-8 * tK ** 3 + 6.5459673 * Math.log(tK)
  }
  return Math.exp(lnP)
}

/**
 * Dew point (or frost point below 0.01 °C), °C, for a vapour partial pressure: inverse of
 * `saturationVapourPressurePa` by bisection on −100…200 °C (the formula's range). The
 * saturation pressure is strictly increasing in t, so the bracket always holds.
 */
export function dewPointCFromVapourPressure(vapourPressurePa: number): number {
  if (!(vapourPressurePa > 0)) return Number.NaN
  let lo = -100
  let hi = 200
  if (vapourPressurePa <= saturationVapourPressurePa(lo)) return lo
  if (vapourPressurePa >= saturationVapourPressurePa(hi)) return hi
  for (let i = 0; i < 100 && hi - lo > 1e-10; i++) {
    const mid = 0.5 * (lo + hi)
    if (saturationVapourPressurePa(mid) < vapourPressurePa) lo = mid
    else hi = mid
  }
  return 0.5 * (lo + hi)
}

export interface HumidAirInput {
  pPa: number
  tK: number
  /** 0…1 (not percent) */
  relativeHumidity: number
  /**
   * Dry-air gas constant. Defaults to the ISO 2533 value used everywhere else in the app, so that
   * RH = 0 gives exactly `dryAirDensity`. Pass R_DRY_AIR_ASHRAE to reproduce ASHRAE/psychrolib.
   */
  dryAirGasConstant?: number
}

export interface HumidAirState {
  /** total density of the mixture (dry air + vapour), kg/m³ */
  moistDensity: number
  /** the oxygen-carrying part, (p − p_v)/(R_d·T), kg/m³: what matters for power */
  dryAirPartialDensity: number
  vapourPressurePa: number
  /** kg water per kg dry air */
  humidityRatio: number
}

/**
 * Humid air from pressure, temperature and relative humidity.
 * p_v = RH·p_ws(T) (ASHRAE 2017 ch. 1 eq. 12/22), W = 0.621945·p_v/(p − p_v) (eq. 20),
 * v = R_d·T·(1 + 1.607858·W)/p per kg dry air (eq. 26), ρ = (1 + W)/v (eq. 11).
 */
export function humidAir({ pPa, tK, relativeHumidity, dryAirGasConstant = R_DRY_AIR }: HumidAirInput): HumidAirState {
  const vapourPressurePa = relativeHumidity * saturationVapourPressurePa(tK - KELVIN_OFFSET)
  const humidityRatio = MOLAR_MASS_RATIO_WATER_AIR * vapourPressurePa / (pPa - vapourPressurePa)
  const specificVolume = dryAirGasConstant * tK * (1 + MOLAR_MASS_RATIO_AIR_WATER * humidityRatio) / pPa
  return {
    moistDensity: (1 + humidityRatio) / specificVolume,
    dryAirPartialDensity: (pPa - vapourPressurePa) / (dryAirGasConstant * tK),
    vapourPressurePa,
    humidityRatio,
  }
}

/** Humidity ratio from vapour pressure, W = 0.621945·p_v/(p − p_v) (ASHRAE 2017 ch. 1 eq. 20). */
export function humidityRatioFromVapourPressure(vapourPressurePa: number, pPa: number): number {
  return MOLAR_MASS_RATIO_WATER_AIR * vapourPressurePa / (pPa - vapourPressurePa)
}

/**
 * Vapour partial pressure in the charge after compression. Compression keeps the humidity
 * ratio and hence the vapour mole fraction, so p_v scales with total pressure
 * (reference sheet §2.2; follows from Dalton's law).
 */
export function chargeVapourPressurePa(ambientVapourPressurePa: number, ambientPressurePa: number, chargePressurePa: number): number {
  return ambientVapourPressurePa * chargePressurePa / ambientPressurePa
}

export interface ChargeDewPointInput {
  ambientPressurePa: number
  ambientTempK: number
  /** 0…1 */
  relativeHumidity: number
  chargePressurePa: number
}

/**
 * Dew point of the boosted charge, °C. If the intercooler cools the charge below this, water
 * condenses in the core (worth a warning in the UI). Reference sheet §2.2, check DEW-B.
 */
export function chargeDewPointC({ ambientPressurePa, ambientTempK, relativeHumidity, chargePressurePa }: ChargeDewPointInput): number {
  const ambientVapourPa = relativeHumidity * saturationVapourPressurePa(ambientTempK - KELVIN_OFFSET)
  return dewPointCFromVapourPressure(chargeVapourPressurePa(ambientVapourPa, ambientPressurePa, chargePressurePa))
}
