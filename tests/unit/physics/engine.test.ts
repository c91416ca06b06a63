import { describe, expect, it } from 'vitest'
import {
  chargeTempFromEffectiveness,
  compressorEfficiencyFromTemps,
  compressorOutletTempK,
  intercoolerEffectiveness,
  isentropicOutletTempK,
  lossPctPerKelvin,
  powerLossKw,
  powerLossPct,
  ruleOfThumbLossPct,
} from '../../../server/analysis/physics'

const K = (tC: number) => tC + 273.15

describe('compressor outlet temperature (standard ideal-gas relation; Heywood 1988 ch. 6, section from memory)', () => {
  it('CMP-1: T1 298.15 K, PR 2.2, η 0.72 → T2 402.778 K, T2s 373.482 K (COMPUTED)', () => {
    expect(Math.abs(compressorOutletTempK(298.15, 2.2, 0.72) - 402.778)).toBeLessThan(1e-3)
    expect(Math.abs(isentropicOutletTempK(298.15, 2.2) - 373.482)).toBeLessThan(1e-3)
  })

  it('CMP-2: T1 293.15 K, PR 1.5, default η 0.70 → 344.587 K (COMPUTED)', () => {
    expect(Math.abs(compressorOutletTempK(293.15, 1.5) - 344.587)).toBeLessThan(1e-3)
  })

  it.each([
    [298.15, 2.2, 0.65, 414.046],
    [298.15, 2.2, 0.78, 394.730],
    [298.15, 2.2, 1.00, 373.482],
    [303.15, 2.5, 0.72, 429.152],
    [298.15, 3.0, 0.75, 444.736],
  ])('T1 %d K, PR %d, η %d → %d K (reference sheet §4 table, COMPUTED)', (t1, pr, eta, t2) => {
    expect(Math.abs(compressorOutletTempK(t1, pr, eta) - t2)).toBeLessThan(1e-3)
  })

  it('backs the efficiency out of a measured outlet temperature, NaN without a rise', () => {
    expect(compressorEfficiencyFromTemps(298.15, 402.778004, 2.2)).toBeCloseTo(0.72, 6)
    // No rise, no efficiency: a clear error instead of NaN (issue 10).
    expect(() => compressorEfficiencyFromTemps(298.15, 298.15, 2.2)).toThrow(/not above the inlet/)
  })
})

describe('intercooler effectiveness (hot-side definition, reference sheet §5)', () => {
  it('IC-EPS: 130 → 45 °C at 25 °C ambient → 0.809524 (COMPUTED)', () => {
    expect(Math.abs(intercoolerEffectiveness(K(130), K(45), K(25)) - 0.809524)).toBeLessThan(1e-6)
  })

  it.each([
    [0.60, 67.00],
    [0.70, 56.50],
    [0.80, 46.00],
    [0.85, 40.75],
  ])('inverse: ε %d from 130 °C at 25 °C → %d °C (COMPUTED)', (eps, outC) => {
    expect(chargeTempFromEffectiveness(K(130), K(25), eps) - 273.15).toBeCloseTo(outC, 9)
  })

  it('is NaN when pre-cooler and ambient are within the 1 K span (undefined ratio)', () => {
    expect(Number.isNaN(intercoolerEffectiveness(K(25.5), K(25.2), K(25)))).toBe(true)
    expect(Number.isNaN(intercoolerEffectiveness(K(25), K(25), K(25), 1e-9))).toBe(true)
  })

  it('is not clamped: a heat-soaked charge hotter than the inlet gives ε < 0', () => {
    expect(intercoolerEffectiveness(K(60), K(70), K(25))).toBeLessThan(0)
  })
})

describe('power loss with charge temperature (reference sheet §7)', () => {
  it('SOAK: 35 → 60 °C at equal pressure: density law 7.50413 %, √T law 3.82523 %, T^0.6 4.57 % (COMPUTED)', () => {
    expect(Math.abs(powerLossPct(K(35), K(60), 'density') - 7.50413)).toBeLessThan(1e-5)
    expect(Math.abs(powerLossPct(K(35), K(60), 'sqrt') - 3.82523)).toBeLessThan(1e-5)
    expect(powerLossPct(K(35), K(60), 'iso')).toBeCloseTo(4.57, 2)
  })

  it('on 150 kW: 11.26 kW (density law), 5.74 kW (√T law) (COMPUTED)', () => {
    expect(powerLossKw(150, K(35), K(60))).toBeCloseTo(11.26, 2)
    expect(powerLossKw(150, K(35), K(60), 'sqrt')).toBeCloseTo(5.74, 2)
  })

  it('exact +3 K at 300 K: 0.990 % (COMPUTED)', () => {
    expect(powerLossPct(300, 303)).toBeCloseTo(0.990, 3)
  })

  it('rule of thumb "about 1 % per 3 K near 300 K" — common practice, no source; checked only against the exact density law', () => {
    // The rule is a trade saying, so the only honest check is how far it strays from the exact
    // density law 1 − T/(T + ΔT) (sheet §7), worked by hand here:
    //   +3 K from 300 K: 1 − 300/303 = 0.990099 % (rule: 1 %, 1 % too high)
    //   +15 K from 300 K: 1 − 300/315 = 4.761905 % (rule: 5 %, 5 % too high)
    //   +3 K from 330 K: 1 − 330/333 = 0.900901 % (rule: 1 %, 11 % too high — it is a 300 K rule)
    expect(ruleOfThumbLossPct(3)).toBeCloseTo(1, 12)
    expect(ruleOfThumbLossPct(15)).toBeCloseTo(5, 12)
    expect(powerLossPct(300, 303)).toBeCloseTo(0.990099, 6)
    expect(powerLossPct(300, 315)).toBeCloseTo(4.761905, 6)
    expect(powerLossPct(330, 333)).toBeCloseTo(0.900901, 6)
  })

  it('linearised density law dρ/ρ = −dT/T: 0.333 %/K at 300 K, 1 % per 2.9 K at 290 K, per 3.3 K at 330 K (sheet §7, COMPUTED)', () => {
    // Also the slope of the exact law: (loss at T + 0.001 K)/0.001 K → 100/T as the step shrinks.
    expect(lossPctPerKelvin(300)).toBeCloseTo(0.333333, 6)
    expect(1 / lossPctPerKelvin(290)).toBeCloseTo(2.9, 12)
    expect(1 / lossPctPerKelvin(330)).toBeCloseTo(3.3, 12)
    expect(powerLossPct(300, 300.001) / 0.001).toBeCloseTo(lossPctPerKelvin(300), 5)
  })
})
