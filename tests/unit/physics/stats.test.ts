import { describe, expect, it } from 'vitest'
import {
  confidenceInterval,
  evaluateExponential,
  fitExponential,
  linearRegression,
  lnGamma,
  maxFinite,
  mean,
  meanFinite,
  regularizedIncompleteBeta,
  sampleStandardDeviation,
  studentTCdf,
  studentTQuantile,
} from '../../../server/analysis/physics'

describe('Student-t quantile', () => {
  // NIST/SEMATECH e-Handbook of Statistical Methods §1.3.6.7.2, "Critical Values of the Student's t
  // Distribution", column 0.025 (three decimals): ν = 1 12.706, 2 4.303, 5 2.571, 10 2.228, 30 2.042, 100 1.984.
  it.each([
    [1, 12.706], [2, 4.303], [5, 2.571], [10, 2.228], [30, 2.042], [100, 1.984],
  ])('t(0.975, %d) = %d (NIST/SEMATECH e-Handbook t table)', (df, t) => {
    expect(Math.abs(studentTQuantile(0.975, df) - t)).toBeLessThanOrEqual(0.0005)
  })

  it('four-decimal values t(0.975, 5) = 2.5706, t(0.975, 10) = 2.2281; SciPy 1.17 t.ppf 2.570581836, 2.228138852 (COMPUTED)', () => {
    expect(studentTQuantile(0.975, 5)).toBeCloseTo(2.5706, 4)
    expect(studentTQuantile(0.975, 10)).toBeCloseTo(2.2281, 4)
    expect(studentTQuantile(0.975, 5)).toBeCloseTo(2.570581836, 8)
    expect(studentTQuantile(0.975, 10)).toBeCloseTo(2.228138852, 8)
    // Non-integer ν as in Welch's test: SciPy t.ppf(0.975, 7.3) = 2.345066737 (COMPUTED).
    expect(studentTQuantile(0.975, 7.3)).toBeCloseTo(2.345066737, 8)
  })

  it('is symmetric and inverts the CDF', () => {
    expect(studentTQuantile(0.025, 5)).toBeCloseTo(-studentTQuantile(0.975, 5), 12)
    expect(studentTCdf(studentTQuantile(0.9, 4), 4)).toBeCloseTo(0.9, 10)
    expect(studentTQuantile(0.5, 3)).toBe(0)
    expect(Number.isNaN(studentTQuantile(1, 3))).toBe(true)
  })

  it('ν = 1 is the Cauchy distribution: F(t) = ½ + atan(t)/π (closed form)', () => {
    for (const t of [-3, -0.5, 0.7, 4]) expect(studentTCdf(t, 1)).toBeCloseTo(0.5 + Math.atan(t) / Math.PI, 12)
  })

  it('building blocks: ln Γ(5) = ln 24, ln Γ(½) = ln √π, I_x(1, 1) = x, I_½(a, a) = ½ (closed forms)', () => {
    expect(lnGamma(5)).toBeCloseTo(Math.log(24), 12)
    expect(lnGamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 12)
    expect(regularizedIncompleteBeta(0.3, 1, 1)).toBeCloseTo(0.3, 12)
    expect(regularizedIncompleteBeta(0.5, 3.7, 3.7)).toBeCloseTo(0.5, 12)
  })
})

describe('mean, SD, confidence interval', () => {
  it('mean and sample SD of 2, 4, 4, 4, 5, 5, 7, 9: 5 and √(32/7) (hand computed)', () => {
    const v = [2, 4, 4, 4, 5, 5, 7, 9]
    expect(mean(v)).toBe(5)
    expect(sampleStandardDeviation(v)).toBeCloseTo(Math.sqrt(32 / 7), 12)
    expect(Number.isNaN(sampleStandardDeviation([1]))).toBe(true)
    expect(Number.isNaN(mean([]))).toBe(true)
  })

  it('means over a range of a typed array and skipping NaN', () => {
    const col = new Float64Array([1, 2, Number.NaN, 4, 100])
    expect(mean(col, 0, 2)).toBe(1.5)
    expect(meanFinite(col, 0, 4)).toBeCloseTo(7 / 3, 12)
    expect(maxFinite(col, 0, 4)).toBe(4)
  })

  it('95 % interval of 0.61, 0.58, 0.64, 0.55, 0.60, 0.57 → 0.558205…0.625128 (SciPy 1.17 stats.t.interval, COMPUTED)', () => {
    const ci = confidenceInterval([0.61, 0.58, 0.64, 0.55, 0.60, 0.57])
    expect(ci.low).toBeCloseTo(0.5582051900855499, 10)
    expect(ci.high).toBeCloseTo(0.6251281432477834, 10)
    expect(ci.n).toBe(6)
  })

  it('one value gives a mean but no interval', () => {
    const ci = confidenceInterval([3])
    expect(ci.mean).toBe(3)
    expect(Number.isNaN(ci.halfWidth)).toBe(true)
  })
})

describe('least-squares line', () => {
  // Anscombe (1973), "Graphs in Statistical Analysis", The American Statistician 27(1): data set I has
  // regression line y = 3.00 + 0.500·x and r² = 0.67 (all four sets share these).
  const x = [10, 8, 13, 9, 11, 14, 6, 4, 12, 7, 5]
  const y = [8.04, 6.95, 7.58, 8.81, 8.33, 9.96, 7.24, 4.26, 10.84, 4.82, 5.68]

  it('Anscombe quartet set I: slope 0.500, intercept 3.00, r² 0.67 (Anscombe 1973)', () => {
    const fit = linearRegression(x, y)
    expect(fit.slope).toBeCloseTo(0.500, 3)
    expect(fit.intercept).toBeCloseTo(3.00, 2)
    expect(fit.r2).toBeCloseTo(0.67, 2)
    expect(fit.n).toBe(11)
  })

  it('recovers an exact line and handles degenerate input', () => {
    const fit = linearRegression([1, 2, 3, 4], [2.5, 4, 5.5, 7])
    expect(fit.slope).toBeCloseTo(1.5, 12)
    expect(fit.intercept).toBeCloseTo(1, 12)
    expect(fit.r2).toBeCloseTo(1, 12)
    expect(Number.isNaN(linearRegression([1], [1]).slope)).toBe(true)
    expect(Number.isNaN(linearRegression([2, 2], [1, 3]).slope)).toBe(true)
    expect(Number.isNaN(linearRegression([1, 2, 3], [5, 5, 5]).r2)).toBe(true)
  })
})

describe('exponential recovery fit (first-order lag; common practice)', () => {
  const t = [0, 5, 10, 20, 30, 45, 60, 90, 120, 180]

  it('recovers τ, asymptote and start of a noise-free cooling curve', () => {
    const y = t.map(s => 305 + 40 * Math.exp(-s / 37))
    const fit = fitExponential(t, y)!
    expect(fit.timeConstant).toBeCloseTo(37, 5)
    expect(fit.asymptote).toBeCloseTo(305, 5)
    expect(fit.initial).toBeCloseTo(345, 5)
    expect(fit.r2).toBeCloseTo(1, 9)
    expect(fit.converged).toBe(true)
    expect(evaluateExponential(fit, 50)).toBeCloseTo(305 + 40 * Math.exp(-50 / 37), 5)
  })

  it('fits a rising curve with a fixed asymptote and an offset time axis', () => {
    const ts = t.map(s => s + 1000)
    const y = ts.map(s => 330 - 20 * Math.exp(-(s - 1000) / 25))
    const fit = fitExponential(ts, y, { asymptote: 330 })!
    expect(fit.timeConstant).toBeCloseTo(25, 5)
    expect(fit.initial).toBeCloseTo(310, 5)
  })

  it('stays close with small noise (±0.2 K, deterministic)', () => {
    const noise = [0.1, -0.2, 0.15, -0.05, 0.2, -0.1, 0.05, -0.15, 0.1, -0.1]
    const y = t.map((s, i) => 305 + 40 * Math.exp(-s / 37) + noise[i]!)
    const fit = fitExponential(t, y)!
    expect(Math.abs(fit.timeConstant - 37)).toBeLessThan(2)
    expect(fit.r2).toBeGreaterThan(0.99)
  })

  it('flags a straight line as not converged and refuses too few points', () => {
    const fit = fitExponential(t, t.map(s => 300 + 0.01 * s))!
    expect(fit.converged).toBe(false)
    expect(fitExponential([0, 1, 2], [3, 2, 1.5])).toBeNull()
    expect(fitExponential([0, 0, 0, 0], [1, 2, 3, 4])).toBeNull()
  })
})
