import psychrolib from 'psychrolib'
import { describe, expect, it } from 'vitest'
import {
  ashraeStandardPressurePa,
  BAROMETRIC_EXPONENT,
  geometricToGeopotentialM,
  geopotentialToGeometricM,
  isaDensity,
  isaPressureAtElevationPa,
  isaPressurePa,
  isaTemperatureK,
  pressureAltitudeM,
  R_DRY_AIR,
  RHO0_KG_M3,
  P0_PA,
  T0_K,
} from '../../../server/analysis/physics'

psychrolib.SetUnitSystem(psychrolib.SI)

const rel = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected)

// ISO 2533:1975 tabulation as reproduced in the metanorma/atmospheric test fixture
// spec/fixtures/tests-geopotential.yml (reference sheet §1.3, CONFIRMED): H (m), T (K), p (hPa), ρ.
const ISO_TABLE: [number, number, number, number][] = [
  [0, 288.15, 1013.25, 1.22500],
  [500, 284.90, 954.608, 1.16727],
  [1000, 281.65, 898.746, 1.11164],
  [1500, 278.40, 845.560, 1.05807],
  [2000, 275.15, 794.952, 1.00649],
  [3000, 268.65, 701.085, 0.909122],
]

describe('ISA troposphere against the ISO 2533 table', () => {
  it.each(ISO_TABLE)('H = %d m (ISO 2533:1975 table)', (hM, tK, pHpa, rho) => {
    expect(isaTemperatureK(hM)).toBeCloseTo(tK, 10)
    // ±0.5 in the last tabulated digit of hPa (0.0005 hPa = 0.05 Pa); the sheet allows ±0.1 Pa.
    expect(Math.abs(isaPressurePa(hM) - pHpa * 100)).toBeLessThanOrEqual(0.1)
    const lastDigit = hM === 3000 ? 5e-7 : 5e-6
    expect(Math.abs(isaDensity(hM) - rho)).toBeLessThanOrEqual(lastDigit)
  })

  // Formula values computed for the reference sheet with R = 287.05287 (COMPUTED, 1e-6 rel).
  it.each([
    [500, 95460.835, 1.1672688],
    [1000, 89874.563, 1.1116425],
    [2000, 79495.202, 1.0064901],
    [3000, 70108.526, 0.9091219],
  ])('H = %d m matches the reference-sheet formula values (COMPUTED)', (hM, pPa, rho) => {
    expect(rel(isaPressurePa(hM), pPa)).toBeLessThan(1e-6)
    expect(rel(isaDensity(hM), rho)).toBeLessThan(1e-6)
  })

  it('sea level gives the ISO 2533 Table 1 constants and ρ0 = 1.225 with the ISA gas-constant pair', () => {
    expect(isaPressurePa(0)).toBe(P0_PA)
    expect(isaTemperatureK(0)).toBe(T0_K)
    // Trap in the reference sheet: CODATA R* with the US76 molar mass gives 1.224978.
    expect(rel(P0_PA / (R_DRY_AIR * T0_K), RHO0_KG_M3)).toBeLessThan(1e-6)
    expect(rel(isaDensity(0), 1.225)).toBeLessThan(1e-6)
  })

  it('barometric exponent g0/(R·L) = 5.255879813 (reference sheet §1.2, COMPUTED)', () => {
    expect(BAROMETRIC_EXPONENT).toBeCloseTo(5.255879813, 8)
  })
})

describe('pressure altitude (inverse formula, reference sheet §1.3 COMPUTED)', () => {
  it.each([
    [95000, 540.34],
    [90000, 988.50],
    [84556, 1500.00],
  ])('p = %d Pa → %d m (ISA-INV)', (pPa, hM) => {
    expect(Math.abs(pressureAltitudeM(pPa) - hM)).toBeLessThan(0.01)
  })
})

describe('geometric ↔ geopotential altitude (ISO 2533 formulas (8), (9))', () => {
  it('Z = 1000 m → H 999.843 m, p 89 876.28 Pa (ISA-Z1000, COMPUTED; US76 geometric table 8.9876E+04 from memory)', () => {
    const hM = geometricToGeopotentialM(1000)
    expect(hM).toBeCloseTo(999.843, 3)
    expect(rel(isaPressureAtElevationPa(1000), 89876.28)).toBeLessThan(1e-6)
    expect(rel(isaDensity(hM), 1.111660)).toBeLessThan(1e-6)
  })

  it('Z = 3000 m → H 2998.585 m, ρ 0.909254 (COMPUTED)', () => {
    const hM = geometricToGeopotentialM(3000)
    expect(hM).toBeCloseTo(2998.585, 3)
    expect(rel(isaDensity(hM), 0.909254)).toBeLessThan(2e-6)
  })

  it('back from geopotential: H 999.843 m → Z 1000 m, H 2998.585 m → Z 3000 m (sheet §1.3 table, COMPUTED)', () => {
    expect(geopotentialToGeometricM(999.843)).toBeCloseTo(1000, 2)
    expect(geopotentialToGeometricM(2998.585)).toBeCloseTo(3000, 2)
  })
})

describe('ASHRAE 2017 ch. 1 eq. 3 simplified standard atmosphere', () => {
  it('matches psychrolib GetStandardAtmPressure (independent implementation)', () => {
    for (const zM of [0, 500, 1000, 2000, 3000]) {
      expect(rel(ashraeStandardPressurePa(zM), psychrolib.GetStandardAtmPressure(zM))).toBeLessThan(1e-12)
    }
    expect(ashraeStandardPressurePa(1000)).toBeCloseTo(89874.51941577366, 6)
  })

  it('differs from the ISO form by < 0.1 Pa at 1000 m (89 874.52 vs 89 874.56, reference sheet §1.2)', () => {
    expect(Math.abs(ashraeStandardPressurePa(1000) - isaPressurePa(1000))).toBeLessThan(0.1)
    expect(psychrolib.GetStandardAtmTemperature(1000)).toBeCloseTo(isaTemperatureK(1000) - 273.15, 10)
  })
})
