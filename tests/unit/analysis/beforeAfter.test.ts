import { describe, expect, it } from 'vitest'
import { compareCores, ComparisonInputError, matchPulls, type ComparisonLogInput, type ComparisonPullInput } from '../../../server/analysis/beforeAfter'
import { welchDifference } from '../../../server/analysis/comparison'
import { studentTQuantile } from '../../../server/analysis/stats'

// A pull with the fields the comparison reads; effectiveness from the definition
// ε = (T_pre − T_charge)/(T_pre − T_amb), so every value below can be checked by hand.
function pull(index: number, ambientC: number, preC: number | null, chargeC: number, boostKpa: number | null, rpm: number | null): ComparisonPullInput {
  return {
    index,
    ambientTempC: ambientC,
    meanChargeTempC: chargeC,
    meanDeltaOverAmbientK: chargeC - ambientC,
    meanManifoldKpa: boostKpa,
    pressureRatio: boostKpa === null ? null : 2,
    preCoolerTempC: preC,
    effectiveness: preC === null ? null : (preC - chargeC) / (preC - ambientC),
    effectivenessSource: preC === null ? null : 'measured',
    meanRpm: rpm,
  }
}

// Before (20 °C day): pulls 1 and 2 at 200–205 kPa and ~3000 rpm, pull 3 at 150 kPa (part load).
//   pull 1: ε = (120 − 58)/(120 − 20) = 0.62, ΔT = 58 − 20 = 38 K
//   pull 2: ε = (120 − 56)/(120 − 20) = 0.64, ΔT = 36 K
//   pull 3: 150 kPa, 2000 rpm: no after pull within ±15 kPa → unmatched
// After (30 °C day):
//   pull 1: ε = (130 − 46)/(130 − 30) = 0.84, ΔT = 16 K
//   pull 2: ε = (130 − 48)/(130 − 30) = 0.82, ΔT = 18 K
//   pull 3: no pre-cooler temperature → effectiveness unknown → unmatched
const before: ComparisonLogInput = { logId: 1, label: '14 Jul', pulls: [pull(0, 20, 120, 58, 200, 3000), pull(1, 20, 120, 56, 205, 3100), pull(2, 20, 110, 40, 150, 2000)] }
const after: ComparisonLogInput = { logId: 2, label: '2 Aug', pulls: [pull(0, 30, 130, 46, 200, 3000), pull(1, 30, 130, 48, 210, 3200), pull(2, 30, null, 50, 205, 3000)] }

describe('matching pulls by boost and engine speed', () => {
  it('matches pulls at a similar load and lists the others with the reason', () => {
    const { matched, unmatched } = matchPulls([before], [after])
    expect(matched.before.map(m => m.pull.index)).toEqual([0, 1])
    expect(matched.after.map(m => m.pull.index)).toEqual([0, 1])
    expect(unmatched).toHaveLength(2)
    expect(unmatched[0]).toMatchObject({ side: 'before', logId: 1, pull: 3 })
    expect(unmatched[0]!.reason).toContain('boost 150 kPa, 2000 rpm')
    expect(unmatched[1]).toMatchObject({ side: 'after', logId: 2, pull: 3 })
    expect(unmatched[1]!.reason).toContain('Effectiveness could not be worked out')
  })

  it('a wider boost band takes the part-load pull in', () => {
    expect(matchPulls([before], [after], 60, 1500).matched.before).toHaveLength(3)
  })
})

describe('normalising to a reference ambient (hand-computed example)', () => {
  const result = compareCores([before], [after], { referenceAmbientC: 25, ratedPowerKw: 100 })

  it('means per side and the differences', () => {
    // ε̄ before = (0.62 + 0.64)/2 = 0.63, after = (0.84 + 0.82)/2 = 0.83, gain 0.20
    expect(result.before.meanEffectiveness).toBeCloseTo(0.63, 12)
    expect(result.after.meanEffectiveness).toBeCloseTo(0.83, 12)
    expect(result.effectivenessGain).toBeCloseTo(0.2, 12)
    // ΔT̄ before = (38 + 36)/2 = 37 K, after = (16 + 18)/2 = 17 K, change −20 K
    expect(result.deltaOverAmbientChangeK).toBeCloseTo(-20, 12)
    expect(result.before.pullCount).toBe(2)
    expect(result.before.totalPullCount).toBe(3)
  })

  it('Welch interval of the gain', () => {
    // s = 0.014142 on each side, SE = √(0.0002/2 + 0.0002/2) = 0.014142,
    // ν = (0.0002)²/[(0.0001)²/1 + (0.0001)²/1] = 2, t(0.975, 2) = 4.302653 (any t table),
    // half-width 4.302653 × 0.014142 = 0.060849 → 0.139151 … 0.260849
    expect(result.degreesOfFreedom.effectivenessGain).toBeCloseTo(2, 9)
    expect(result.intervals.effectivenessGain![0]).toBeCloseTo(0.139151, 5)
    expect(result.intervals.effectivenessGain![1]).toBeCloseTo(0.260849, 5)
    // ΔT: s = 1.41421 each side, SE = 1.41421, half-width 4.302653 × 1.414214 = 6.08487 → −26.08487 … −13.91513 K
    expect(result.intervals.deltaOverAmbientChangeK![0]).toBeCloseTo(-26.08487, 4)
    expect(result.intervals.deltaOverAmbientChangeK![1]).toBeCloseTo(-13.91513, 4)
  })

  it('charge temperature and density at 25 °C', () => {
    // PR = 2: 2^(0.4/1.4) = 1.2190137; T2 = 298.15·(1 + 0.2190137/0.70) = 391.4344 K (118.28 °C)
    // before: 391.4344 − 0.63·93.2844 = 332.6652 K = 59.515 °C
    // after:  391.4344 − 0.83·93.2844 = 314.0083 K = 40.858 °C; change −0.20·93.2844 = −18.657 K
    // density (and power, air-limited) gain 332.6652/314.0083 − 1 = 5.9415 %, of 100 kW = 5.94 kW
    expect(result.preCoolerAtReferenceC).toBeCloseTo(118.284, 2)
    expect(result.before.chargeTempAtReferenceC).toBeCloseTo(59.515, 2)
    expect(result.after.chargeTempAtReferenceC).toBeCloseTo(40.858, 2)
    expect(result.chargeTempAtReferenceChangeK).toBeCloseTo(-18.657, 2)
    expect(result.densityGainPct).toBeCloseTo(5.9415, 2)
    expect(result.powerRecoveredKw).toBeCloseTo(5.9415, 2)
    // the interval maps through the same line: −0.260849·93.2844 … −0.139151·93.2844
    expect(result.intervals.chargeTempAtReferenceChangeK![0]).toBeCloseTo(-24.333, 2)
    expect(result.intervals.chargeTempAtReferenceChangeK![1]).toBeCloseTo(-12.981, 2)
  })

  it('says the after core works better, and why the days differ', () => {
    expect(result.verdictTone).toBe('better')
    expect(result.verdict).toContain('The after core works better')
    expect(result.dynoSpreadNote).toContain('Common practice, no source')
    expect(result.warnings.map(w => w.code)).toEqual(['different-days'])
  })
})

describe('plain words when the raw charge temperatures mislead', () => {
  it('warns when the hotter after day logged hotter charge air with a better core', () => {
    // After day at 45 °C: the same ΔT of 16 and 18 K gives 61 and 63 °C charge air, hotter than
    // the before pulls' 58 and 56 °C, although effectiveness rose.
    const hot: ComparisonLogInput = { logId: 3, label: 'hot day', pulls: [pull(0, 45, 145, 61, 200, 3000), pull(1, 45, 145, 63, 205, 3100)] }
    const result = compareCores([before], [hot])
    expect(result.after.meanChargeTempC).toBeGreaterThan(result.before.meanChargeTempC)
    expect(result.effectivenessGain).toBeGreaterThan(0)
    expect(result.warnings[0]!.code).toBe('raw-misleads')
    expect(result.warnings[0]!.message).toContain('raw charge temperatures mislead')
  })

  it('calls a small, spread-out change within the noise', () => {
    const a: ComparisonLogInput = { logId: 4, label: 'a', pulls: [pull(0, 20, 120, 58, 200, 3000), pull(1, 20, 120, 50, 200, 3000)] }
    const b: ComparisonLogInput = { logId: 5, label: 'b', pulls: [pull(0, 20, 120, 57, 200, 3000), pull(1, 20, 120, 52, 200, 3000)] }
    const result = compareCores([a], [b])
    expect(result.verdictTone).toBe('noise')
    expect(result.verdict).toContain('within the noise')
  })
})

describe('choices that cannot be compared', () => {
  const expectError = (fn: () => unknown, code: string, logId?: number) => {
    try {
      fn()
    }
    catch (error) {
      expect(error).toBeInstanceOf(ComparisonInputError)
      expect((error as ComparisonInputError).code).toBe(code)
      expect((error as ComparisonInputError).logId).toBe(logId)
      return (error as Error).message
    }
    throw new Error('expected an error')
  }
  it('an empty side, the same log twice, a log without pulls, a log without effectiveness', () => {
    expect(expectError(() => compareCores([], [after]), 'EMPTY_SIDE')).toContain('before')
    expect(expectError(() => compareCores([before], [{ ...before }]), 'SAME_LOG', 1)).toContain('14 Jul')
    expect(expectError(() => compareCores([before], [{ logId: 9, label: 'empty day', pulls: [] }]), 'NO_PULLS', 9)).toContain('empty day')
    const noPre: ComparisonLogInput = { logId: 8, label: 'no sensor', pulls: [pull(0, 20, null, 50, null, 3000)] }
    expect(expectError(() => compareCores([before], [noPre]), 'NO_EFFECTIVENESS', 8)).toContain('no pre-cooler temperature')
    const farApart: ComparisonLogInput = { logId: 7, label: 'far', pulls: [pull(0, 20, 120, 50, 300, 5000)] }
    expectError(() => compareCores([before], [farApart]), 'NO_MATCH')
  })
})

// Build a sample of n values with exactly the given mean and standard deviation (n − 1), so a
// published summary-statistics example can be checked through the functions that take raw data.
function sampleWith(n: number, mean: number, sd: number): number[] {
  const raw = Array.from({ length: n }, (_, i) => i - (n - 1) / 2)
  const rawSd = Math.sqrt(raw.reduce((s, v) => s + v * v, 0) / (n - 1))
  return raw.map(v => mean + v * sd / rawSd)
}

describe('Welch interval against a published example', () => {
  it('NIST/SEMATECH e-Handbook of Statistical Methods §1.3.5.3 (AUTO83B mileage, US vs Japanese cars): T = −12.94627, ν = 136.8750 with unequal variances', () => {
    // Summary statistics printed in the Handbook (also in the Boost.Math Student's t two-sample
    // tutorial, which uses the same NIST data): US n = 249, mean 20.14458, s 6.41470;
    // Japanese n = 79, mean 30.48101, s 6.10771.
    const us = sampleWith(249, 20.14458, 6.41470)
    const japanese = sampleWith(79, 30.48101, 6.10771)
    const d = welchDifference(japanese, us)
    // difference = US − Japanese, as the Handbook's T is printed
    expect(d.mean / d.standardError).toBeCloseTo(-12.94627, 3)
    expect(d.df).toBeCloseTo(136.8750, 2)
    // the Handbook's critical value for the unequal-variance test: t(0.975, 136.875) = 1.9774
    expect(studentTQuantile(0.975, d.df)).toBeCloseTo(1.9774, 4)
  })
})
