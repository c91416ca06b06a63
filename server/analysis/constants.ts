// Physical constants for the charge-air analysis. SI units throughout.
//
// Trap (reference sheet §1.1): do not pair the current CODATA universal gas constant
// (8.314 462 618) with the US76 molar mass 0.028 964 4. That gives R = 287.0580 and a sea-level
// density of 1.224978 instead of the tabulated 1.225. The ISA pair below is used instead.

/** Universal gas constant as used by ISA / US76, J/(mol·K). ISO 2533:1975 Table 1. */
export const R_UNIVERSAL_ISA = 8.31432

/** Molar mass of dry air, kg/mol. ISO 2533:1975 §2.1 (28.964 420 kg/kmol). */
export const MOLAR_MASS_AIR_KG_MOL = 0.02896442

/**
 * Specific gas constant of dry air, J/(kg·K). ISO 2533:1975 formula (3), R = R* / M, tabulated
 * as 287.052 87. Used app-wide for dry-air and ISA density.
 */
export const R_DRY_AIR = 287.05287

/**
 * Specific gas constant of dry air used by ASHRAE Handbook Fundamentals 2017 ch. 1 (and by the
 * psychrolib package), J/(kg·K). Differs from R_DRY_AIR by 3.8e-5 relative; kept so psychrometric
 * results can be compared with that implementation exactly.
 */
export const R_DRY_AIR_ASHRAE = 287.042

/** Ratio of molar masses water/dry air, ASHRAE 2017 ch. 1 eq. 20 (humidity ratio constant). */
export const MOLAR_MASS_RATIO_WATER_AIR = 0.621945

/** Ratio of molar masses dry air/water, ASHRAE 2017 ch. 1 eq. 26 (moist-air volume). */
export const MOLAR_MASS_RATIO_AIR_WATER = 1.607858

/** ISA sea-level pressure, Pa. ISO 2533:1975 Table 1. */
export const P0_PA = 101325

/** ISA sea-level temperature, K. ISO 2533:1975 Table 1. */
export const T0_K = 288.15

/** ISA sea-level density, kg/m³. ISO 2533:1975 Table 1. */
export const RHO0_KG_M3 = 1.225

// Standard gravity and the Celsius offset define units too (psi, PS, °C), so they live in the
// unit catalogue; the engine keeps importing them from here.
export { G0_M_S2, KELVIN_OFFSET } from '../../shared/quantities/units'

/** Tropospheric temperature lapse rate, K/m (temperature falls with height). ISO 2533 Table 4. */
export const LAPSE_RATE_K_M = 0.0065

/** Upper limit of the troposphere layer, geopotential metres. ISO 2533 Table 4. */
export const TROPOPAUSE_M = 11000

/** Ratio of specific heats of air. ISO 2533:1975 §2.14. */
export const GAMMA_AIR = 1.4

/** Nominal Earth radius for geopotential altitude, m. ISO 2533:1975 Table 1. */
export const EARTH_RADIUS_M = 6356766

/**
 * Specific heat of air at constant pressure, J/(kg·K). Common practice, no source: the value
 * varies by about 0.5 % between 0 and 130 °C, which is below the other uncertainties here.
 */
export const CP_AIR = 1005
