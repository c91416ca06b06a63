// Small statistics kit: means, sample SD, Student-t quantiles and confidence intervals,
// least-squares line, exponential recovery fit. Works on plain arrays and typed arrays; the
// range arguments let callers average a pull inside a column without slicing it.

type Numbers = ArrayLike<number>

/** Arithmetic mean over [start, end). NaN if the range is empty; NaN samples propagate. */
export function mean(values: Numbers, start = 0, end = values.length): number {
  let sum = 0
  for (let i = start; i < end; i++) sum += values[i]!
  return end > start ? sum / (end - start) : Number.NaN
}

/** Mean of the finite samples in [start, end) (missing samples stored as NaN are skipped). */
export function meanFinite(values: Numbers, start = 0, end = values.length): number {
  let sum = 0
  let n = 0
  for (let i = start; i < end; i++) {
    const v = values[i]!
    if (Number.isFinite(v)) {
      sum += v
      n++
    }
  }
  return n > 0 ? sum / n : Number.NaN
}

/** Largest finite value in [start, end); NaN if there is none. */
export function maxFinite(values: Numbers, start = 0, end = values.length): number {
  let best = Number.NEGATIVE_INFINITY
  for (let i = start; i < end; i++) {
    const v = values[i]!
    if (v > best) best = v
  }
  return best === Number.NEGATIVE_INFINITY ? Number.NaN : best
}

/** Sample standard deviation (n − 1 denominator, two-pass for accuracy). NaN for n < 2. */
export function sampleStandardDeviation(values: Numbers): number {
  const n = values.length
  if (n < 2) return Number.NaN
  const m = mean(values)
  let ss = 0
  for (let i = 0; i < n; i++) {
    const d = values[i]! - m
    ss += d * d
  }
  return Math.sqrt(ss / (n - 1))
}

// Lanczos approximation of ln Γ(x), g = 7, nine coefficients (Lanczos 1964, coefficients as
// tabulated by P. Godfrey; relative error ~1e-15 for x > 0).
const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313,
  -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6,
  1.5056327351493116e-7,
]

export function lnGamma(x: number): number {
  if (x < 0.5) {
    // Reflection formula Γ(x)Γ(1 − x) = π/sin(πx).
    return Math.log(Math.PI / Math.abs(Math.sin(Math.PI * x))) - lnGamma(1 - x)
  }
  const z = x - 1
  let a = LANCZOS[0]!
  const t = z + 7.5
  for (let i = 1; i < 9; i++) a += LANCZOS[i]! / (z + i)
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(a)
}

// Continued fraction for the incomplete beta function, evaluated with the modified Lentz
// method (Abramowitz & Stegun 26.5.8; Lentz 1976).
function betaContinuedFraction(x: number, a: number, b: number): number {
  const tiny = 1e-300
  let c = 1
  let d = 1 - (a + b) * x / (a + 1)
  if (Math.abs(d) < tiny) d = tiny
  d = 1 / d
  let h = d
  for (let m = 1; m <= 500; m++) {
    const m2 = 2 * m
    let num = m * (b - m) * x / ((a + m2 - 1) * (a + m2))
    d = 1 + num * d
    if (Math.abs(d) < tiny) d = tiny
    c = 1 + num / c
    if (Math.abs(c) < tiny) c = tiny
    d = 1 / d
    h *= d * c
    num = -(a + m) * (a + b + m) * x / ((a + m2) * (a + m2 + 1))
    d = 1 + num * d
    if (Math.abs(d) < tiny) d = tiny
    c = 1 + num / c
    if (Math.abs(c) < tiny) c = tiny
    d = 1 / d
    const delta = d * c
    h *= delta
    if (Math.abs(delta - 1) < 1e-15) break
  }
  return h
}

/** Regularized incomplete beta I_x(a, b) (A&S 26.5.8 continued fraction, symmetry 26.5.2). */
export function regularizedIncompleteBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0
  if (x >= 1) return 1
  const lnFront = lnGamma(a + b) - lnGamma(a) - lnGamma(b) + a * Math.log(x) + b * Math.log(1 - x)
  const front = Math.exp(lnFront)
  // The fraction converges fast for x < (a + 1)/(a + b + 2); use symmetry otherwise.
  if (x < (a + 1) / (a + b + 2)) return front * betaContinuedFraction(x, a, b) / a
  return 1 - front * betaContinuedFraction(1 - x, b, a) / b
}

/** Student-t cumulative distribution, F(t; ν) = 1 − ½·I_{ν/(ν+t²)}(ν/2, ½) for t ≥ 0 (A&S 26.7.1). */
export function studentTCdf(t: number, df: number): number {
  const tail = 0.5 * regularizedIncompleteBeta(df / (df + t * t), df / 2, 0.5)
  return t >= 0 ? 1 - tail : tail
}

/**
 * Student-t quantile: the t with F(t; ν) = p, for any real ν > 0 (Welch degrees of freedom are
 * not integers). Found by bisection on the CDF above, to 1e-12.
 */
export function studentTQuantile(p: number, df: number): number {
  if (!(p > 0 && p < 1) || !(df > 0)) return Number.NaN
  if (p === 0.5) return 0
  if (p < 0.5) return -studentTQuantile(1 - p, df)
  let lo = 0
  let hi = 1
  while (studentTCdf(hi, df) < p && hi < 1e12) {
    lo = hi
    hi *= 2
  }
  for (let i = 0; i < 200 && hi - lo > 1e-12 * Math.max(1, hi); i++) {
    const mid = 0.5 * (lo + hi)
    if (studentTCdf(mid, df) < p) lo = mid
    else hi = mid
  }
  return 0.5 * (lo + hi)
}

export interface ConfidenceInterval {
  n: number
  mean: number
  /** sample standard deviation */
  sd: number
  standardError: number
  /** half-width of the interval (t·SE) */
  halfWidth: number
  low: number
  high: number
  level: number
}

/**
 * Mean with a Student-t confidence interval, mean ± t(1 − α/2, n − 1)·s/√n. With n < 2 the
 * interval is undefined and low/high/halfWidth are NaN (the mean is still given for n = 1).
 */
export function confidenceInterval(values: Numbers, level = 0.95): ConfidenceInterval {
  const n = values.length
  const m = mean(values)
  const sd = sampleStandardDeviation(values)
  const standardError = sd / Math.sqrt(n)
  const halfWidth = n >= 2 ? studentTQuantile(1 - (1 - level) / 2, n - 1) * standardError : Number.NaN
  return { n, mean: m, sd, standardError, halfWidth, low: m - halfWidth, high: m + halfWidth, level }
}

export interface LinearFit {
  slope: number
  intercept: number
  /** coefficient of determination; NaN when y does not vary */
  r2: number
  n: number
}

/** Ordinary least-squares line y = intercept + slope·x (centred sums for accuracy). */
export function linearRegression(x: Numbers, y: Numbers): LinearFit {
  const n = Math.min(x.length, y.length)
  if (n < 2) return { slope: Number.NaN, intercept: Number.NaN, r2: Number.NaN, n }
  const mx = mean(x, 0, n)
  const my = mean(y, 0, n)
  let sxx = 0
  let sxy = 0
  let syy = 0
  for (let i = 0; i < n; i++) {
    const dx = x[i]! - mx
    const dy = y[i]! - my
    sxx += dx * dx
    sxy += dx * dy
    syy += dy * dy
  }
  if (sxx === 0) return { slope: Number.NaN, intercept: Number.NaN, r2: Number.NaN, n }
  const slope = sxy / sxx
  return { slope, intercept: my - slope * mx, r2: syy > 0 ? (sxy * sxy) / (sxx * syy) : Number.NaN, n }
}

export interface ExponentialFit {
  /** τ in the unit of x (seconds when x is time in s) */
  timeConstant: number
  /** the value the curve tends to, y∞ */
  asymptote: number
  /** fitted value at the first x */
  initial: number
  /** first x; the model is y = asymptote + (initial − asymptote)·exp(−(x − x0)/τ) */
  x0: number
  r2: number
  /** root-mean-square residual */
  rmse: number
  /** false when the best τ sits at the edge of the searched range (curve nearly straight or a step) */
  converged: boolean
}

export interface ExponentialFitOptions {
  /** fix y∞ (e.g. ambient temperature) instead of fitting it */
  asymptote?: number
}

/**
 * Fit y = y∞ + (y0 − y∞)·exp(−(x − x0)/τ): temperature relaxing towards an asymptote between
 * pulls (Newton's law of cooling; a first-order lag, common practice for sensor and core
 * recovery). For a fixed τ the model is linear in y∞ and the amplitude, so those are solved by
 * least squares and τ is found by a log-spaced scan then golden-section search on the residual.
 * Returns null with fewer than 3 points (4 when y∞ is free) or no spread in x.
 */
export function fitExponential(x: Numbers, y: Numbers, options: ExponentialFitOptions = {}): ExponentialFit | null {
  const n = Math.min(x.length, y.length)
  const fixed = options.asymptote
  if (n < (fixed === undefined ? 4 : 3)) return null
  const x0 = x[0]!
  let xMax = x0
  for (let i = 1; i < n; i++) if (x[i]! - x0 > xMax - x0) xMax = x[i]!
  const span = xMax - x0
  if (!(span > 0)) return null

  const solve = (tau: number) => {
    let se = 0, see = 0, sy = 0, sey = 0
    for (let i = 0; i < n; i++) {
      const e = Math.exp(-(x[i]! - x0) / tau)
      se += e
      see += e * e
      sy += y[i]!
      sey += e * y[i]!
    }
    let asymptote: number
    let amplitude: number
    if (fixed === undefined) {
      const det = n * see - se * se
      amplitude = det !== 0 ? (n * sey - se * sy) / det : 0
      asymptote = (sy - amplitude * se) / n
    }
    else {
      asymptote = fixed
      amplitude = see > 0 ? (sey - fixed * se) / see : 0
    }
    let sse = 0
    for (let i = 0; i < n; i++) {
      const r = y[i]! - asymptote - amplitude * Math.exp(-(x[i]! - x0) / tau)
      sse += r * r
    }
    return { asymptote, amplitude, sse }
  }

  // Scan ln τ over span·1e-3 … span·1e2, then refine between the best point's neighbours.
  const lnLo = Math.log(span * 1e-3)
  const lnHi = Math.log(span * 1e2)
  const steps = 80
  let bestK = 0
  let bestSse = Number.POSITIVE_INFINITY
  for (let k = 0; k <= steps; k++) {
    const { sse } = solve(Math.exp(lnLo + (lnHi - lnLo) * k / steps))
    if (sse < bestSse) {
      bestSse = sse
      bestK = k
    }
  }
  let a = lnLo + (lnHi - lnLo) * Math.max(0, bestK - 1) / steps
  let b = lnLo + (lnHi - lnLo) * Math.min(steps, bestK + 1) / steps
  const phi = (Math.sqrt(5) - 1) / 2
  let c = b - phi * (b - a)
  let d = a + phi * (b - a)
  let fc = solve(Math.exp(c)).sse
  let fd = solve(Math.exp(d)).sse
  for (let i = 0; i < 100 && b - a > 1e-10; i++) {
    if (fc < fd) {
      b = d
      d = c
      fd = fc
      c = b - phi * (b - a)
      fc = solve(Math.exp(c)).sse
    }
    else {
      a = c
      c = d
      fc = fd
      d = a + phi * (b - a)
      fd = solve(Math.exp(d)).sse
    }
  }
  const timeConstant = Math.exp(0.5 * (a + b))
  const best = solve(timeConstant)
  const my = mean(y, 0, n)
  let sst = 0
  for (let i = 0; i < n; i++) sst += (y[i]! - my) ** 2
  return {
    timeConstant,
    asymptote: best.asymptote,
    initial: best.asymptote + best.amplitude,
    x0,
    r2: sst > 0 ? 1 - best.sse / sst : Number.NaN,
    rmse: Math.sqrt(best.sse / n),
    converged: bestK > 0 && bestK < steps,
  }
}

/** Evaluate a fitted recovery curve at x. */
export function evaluateExponential(fit: ExponentialFit, x: number): number {
  return fit.asymptote + (fit.initial - fit.asymptote) * Math.exp(-(x - fit.x0) / fit.timeConstant)
}
