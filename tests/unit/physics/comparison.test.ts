import { describe, expect, it } from 'vitest'
import { ambientComparable, compareBeforeAfter, compareSamples, welchDifference } from '../../../server/analysis/physics'

const before = [0.61, 0.58, 0.64, 0.55, 0.60, 0.57]
const after = [0.78, 0.81, 0.76, 0.83, 0.79]

describe('before vs after comparison', () => {
  it('Welch difference: ν 8.98768, 95 % CI 0.162147…0.242519 (SciPy 1.17 ttest_ind(equal_var=False).confidence_interval, COMPUTED)', () => {
    const d = welchDifference(before, after)
    expect(d.df).toBeCloseTo(8.987683630435317, 9)
    expect(d.low).toBeCloseTo(0.16214731818413416, 9)
    expect(d.high).toBeCloseTo(0.24251934848253257, 9)
    expect(d.mean).toBeCloseTo(0.794 - 0.5916666666666667, 12)
  })

  it('flags separated intervals and a difference that excludes zero', () => {
    const c = compareSamples(before, after)
    expect(c.intervalsSeparate).toBe(true)
    expect(c.differenceExcludesZero).toBe(true)
    expect(c.before.n).toBe(6)
    expect(c.after.n).toBe(5)
  })

  it('does not flag overlapping samples', () => {
    const c = compareSamples([0.60, 0.65, 0.55, 0.62], [0.61, 0.66, 0.57, 0.63])
    expect(c.intervalsSeparate).toBe(false)
    expect(c.differenceExcludesZero).toBe(false)
  })

  it('drops non-finite pulls and gives NaN intervals (no flags) with fewer than two values', () => {
    const c = compareSamples([0.6, Number.NaN, 0.62], [0.8])
    expect(c.before.n).toBe(2)
    expect(Number.isNaN(c.after.halfWidth)).toBe(true)
    expect(c.intervalsSeparate).toBe(false)
    expect(c.differenceExcludesZero).toBe(false)
  })

  it('zero spread on both sides collapses the difference interval to a point', () => {
    const d = welchDifference([1, 1, 1], [2, 2])
    expect(d.halfWidth).toBe(0)
    expect(d.low).toBe(1)
  })

  it('compares both issue quantities', () => {
    const r = compareBeforeAfter(
      { effectiveness: before, deltaOverAmbientK: [30, 34, 28, 36, 31, 33] },
      { effectiveness: after, deltaOverAmbientK: [12, 14, 11, 15, 13] },
    )
    expect(r.effectiveness.intervalsSeparate).toBe(true)
    expect(r.deltaOverAmbientK.difference.mean).toBeLessThan(0)
  })
})

describe('ambient comparability (3 K default: common practice, no source)', () => {
  it('within and outside the tolerance, and configurable', () => {
    expect(ambientComparable(298.15, 301.05).comparable).toBe(true)
    expect(ambientComparable(298.15, 301.25).comparable).toBe(false)
    expect(ambientComparable(301.25, 298.15).differenceK).toBeCloseTo(-3.1, 10)
    expect(ambientComparable(298.15, 303.15, 5)).toMatchObject({ comparable: true, toleranceK: 5 })
  })
})
