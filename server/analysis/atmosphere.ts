// ISA troposphere (0…11 000 m geopotential). ISO 2533:1975 formulas (8), (9), (11), (12), (14);
// identical to ICAO Doc 7488/3 and US Standard Atmosphere 1976 in this layer.
// Altitudes `hM` are geopotential metres unless the name says geometric (`zM`).
import { EARTH_RADIUS_M, G0_M_S2, LAPSE_RATE_K_M, P0_PA, R_DRY_AIR, T0_K, TROPOPAUSE_M } from './constants'

/** Barometric exponent g0/(R·L) = 5.255 88 (ISO 2533 formula (12)). */
export const BAROMETRIC_EXPONENT = G0_M_S2 / (R_DRY_AIR * LAPSE_RATE_K_M)

/**
 * Warns callers that the troposphere formulas were used outside their layer. Values outside
 * 0…11 000 m are still computed (the formula extends smoothly below 0 m, which is needed for
 * sites below sea level and high-pressure days), but above the tropopause they are wrong.
 */
export function isWithinTroposphere(hM: number): boolean {
  return hM >= -5000 && hM <= TROPOPAUSE_M
}

/** T(H) = T0 − L·H (ISO 2533 formula (11)). */
export function isaTemperatureK(hM: number): number {
  return T0_K - LAPSE_RATE_K_M * hM
}

/** p(H) = p0·(T/T0)^(g0/(R·L)) (ISO 2533 formula (12)). */
export function isaPressurePa(hM: number): number {
  return P0_PA * Math.pow(isaTemperatureK(hM) / T0_K, BAROMETRIC_EXPONENT)
}

/** ρ(H) = p/(R·T) (ISO 2533 formula (14)). */
export function isaDensity(hM: number): number {
  return isaPressurePa(hM) / (R_DRY_AIR * isaTemperatureK(hM))
}

/**
 * Pressure altitude: the geopotential height at which the ISA pressure equals `pPa`.
 * H = (T0/L)·[1 − (p/p0)^(R·L/g0)] (inverse of ISO 2533 formula (12)).
 */
export function pressureAltitudeM(pPa: number): number {
  return (T0_K / LAPSE_RATE_K_M) * (1 - Math.pow(pPa / P0_PA, 1 / BAROMETRIC_EXPONENT))
}

/** Geometric (GPS, map) → geopotential altitude: H = r0·Z/(r0 + Z) (ISO 2533 formula (8)). */
export function geometricToGeopotentialM(zM: number): number {
  return EARTH_RADIUS_M * zM / (EARTH_RADIUS_M + zM)
}

/** Geopotential → geometric altitude: Z = r0·H/(r0 − H) (ISO 2533 formula (9)). */
export function geopotentialToGeometricM(hM: number): number {
  return EARTH_RADIUS_M * hM / (EARTH_RADIUS_M - hM)
}

/** ISA pressure at a geometric site elevation (what a workshop enters), Pa. */
export function isaPressureAtElevationPa(zM: number): number {
  return isaPressurePa(geometricToGeopotentialM(zM))
}

/**
 * ASHRAE Handbook Fundamentals 2017 ch. 1 eq. 3 simplified standard-atmosphere pressure
 * p = 101 325·(1 − 2.255 77e−5·Z)^5.2559 (as used by psychrolib `GetStandardAtmPressure`).
 * Differs from the ISO form by about 0.04 Pa at 1000 m; kept for comparison with that library.
 */
export function ashraeStandardPressurePa(zM: number): number {
  return 101325 * Math.pow(1 - 2.25577e-5 * zM, 5.2559)
}
