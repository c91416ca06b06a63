// Property tests (fast-check): physical invariants that must hold for any input in range.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  confidenceInterval,
  counterflowEffectiveness,
  crossflowUnmixedApprox,
  crossflowUnmixedExact,
  dryAirDensity,
  fromSI,
  humidAir,
  intercoolerEffectiveness,
  isaPressurePa,
  pressureAltitudeM,
  toSI,
  UNITS,
} from '../../../server/analysis/physics'

const num = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true })

describe('density', () => {
  it('falls as temperature rises (dry and humid)', () => {
    fc.assert(fc.property(num(50000, 300000), num(230, 420), num(0.01, 30), num(0, 1), (pPa, tK, dT, rh) => {
      expect(dryAirDensity(pPa, tK + dT)).toBeLessThan(dryAirDensity(pPa, tK))
      const tC = tK - 273.15
      // Humid air at fixed vapour pressure: keep the saturation pressure well below p.
      if (tC + dT < 60) {
        const a = humidAir({ pPa, tK, relativeHumidity: rh })
        const b = humidAir({ pPa, tK: tK + dT, relativeHumidity: a.vapourPressurePa / Math.max(humidAir({ pPa, tK: tK + dT, relativeHumidity: 1 }).vapourPressurePa, 1e-9) })
        // Same vapour pressure on both sides (rh was applied twice before, so a drier b could be denser).
        expect(b.vapourPressurePa).toBeCloseTo(a.vapourPressurePa, 9)
        expect(b.moistDensity).toBeLessThan(a.moistDensity)
      }
    }))
  })
})

describe('intercooler effectiveness', () => {
  it('stays in [0, 1] for physical inputs pre ≥ charge ≥ ambient', () => {
    fc.assert(fc.property(num(230, 350), num(1, 200), num(0, 1), (ambientK, spanK, frac) => {
      const preK = ambientK + spanK
      const chargeK = ambientK + frac * spanK
      const eps = intercoolerEffectiveness(preK, chargeK, ambientK)
      expect(eps).toBeGreaterThanOrEqual(0)
      expect(eps).toBeLessThanOrEqual(1)
    }))
  })
})

describe('ISA', () => {
  it('altitude ↔ pressure round-trips over −500…11 000 m', () => {
    fc.assert(fc.property(num(-500, 11000), (hM) => {
      expect(Math.abs(pressureAltitudeM(isaPressurePa(hM)) - hM)).toBeLessThan(1e-6)
    }))
  })
})

describe('ε-NTU crossflow, both unmixed', () => {
  it('exact ε is ≥ 0 and ≤ counterflow (the best arrangement), and ≤ 1', () => {
    fc.assert(fc.property(num(0, 10), num(0, 1), (ntu, cr) => {
      const eps = crossflowUnmixedExact(ntu, cr)
      expect(eps).toBeGreaterThanOrEqual(0)
      expect(eps).toBeLessThanOrEqual(counterflowEffectiveness(ntu, cr) + 1e-12)
      expect(eps).toBeLessThanOrEqual(1)
    }))
  })

  it('exact and approximate ε rise monotonically with NTU', () => {
    fc.assert(fc.property(num(0, 8), num(0.001, 2), num(0, 1), (ntu, dNtu, cr) => {
      expect(crossflowUnmixedExact(ntu + dNtu, cr)).toBeGreaterThanOrEqual(crossflowUnmixedExact(ntu, cr) - 1e-12)
      expect(crossflowUnmixedApprox(ntu + dNtu, cr)).toBeGreaterThanOrEqual(crossflowUnmixedApprox(ntu, cr) - 1e-12)
    }))
  })
})

describe('units and statistics', () => {
  it('every unit round-trips through SI', () => {
    const all = Object.values(UNITS).flat()
    fc.assert(fc.property(fc.constantFrom(...all), num(-1e6, 1e6), (u, v) => {
      expect(fromSI(toSI(v, u), u)).toBeCloseTo(v, 6)
    }))
  })

  it('the 95 % interval contains the sample mean and narrows to it with zero spread', () => {
    fc.assert(fc.property(fc.array(num(-100, 100), { minLength: 2, maxLength: 30 }), (values) => {
      const ci = confidenceInterval(values)
      expect(ci.low).toBeLessThanOrEqual(ci.mean + 1e-9)
      expect(ci.high).toBeGreaterThanOrEqual(ci.mean - 1e-9)
    }))
  })
})
