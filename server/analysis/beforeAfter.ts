// Before and after: do two cores differ, honestly, when the two days had different ambient
// temperatures? Pure functions over the pulls the engine already found (no Nuxt, no database).
//
// Steps, each named:
// 1. Per pull, the two quantities that do not move much with the day's ambient temperature:
//    effectiveness ε = (T_pre − T_charge)/(T_pre − T_amb) and temperature over ambient
//    ΔT = T_charge − T_amb (definitions, reference sheet §5).
// 2. Pulls are matched by boost and engine speed: a pull counts only when the other side has a
//    pull within ±BOOST_TOLERANCE_KPA and ±RPM_TOLERANCE (common practice, no source: a core is
//    judged at the load it sees). Unmatched pulls are listed with the reason, never dropped silently.
// 3. Statistics on the matched pulls: mean ± Student-t 95 % interval per side, Welch interval for
//    after − before (comparison.ts; Welch 1947, Satterthwaite 1946).
// 4. Both cores at one reference ambient: compressor outlet from the ideal-gas relation at the
//    matched pulls' mean pressure ratio, T2 = T1·[1 + (PR^((γ−1)/γ) − 1)/η] (compressor.ts,
//    Heywood 1988 ch. 6), then T_charge = T2 − ε̄·(T2 − T_ref) per side. The change is
//    −Δε̄·(T2 − T_ref): linear in the effectiveness gain, so its interval follows from Δε̄'s.
// 5. Density at the same manifold pressure follows ρ = p/(R·T) (ideal gas), so the density gain
//    is T_before/T_after − 1; power follows density for an air-limited engine at the same boost,
//    an upper bound (power.ts).
import { AMBIENT_TOLERANCE_K, compareSamples, type SampleComparison } from './comparison'
import { compressorOutletTempK, DEFAULT_COMPRESSOR_EFFICIENCY } from './compressor'
import { KELVIN_OFFSET } from './constants'

/** Boost band for matching, kPa either side. Common practice, no source. */
export const BOOST_TOLERANCE_KPA = 15
/** Engine-speed band for matching, rpm either side. Common practice, no source. */
export const RPM_TOLERANCE = 500
export const DEFAULT_REFERENCE_AMBIENT_C = 25

export const DYNO_SPREAD_NOTE = 'Common practice, no source: power measured on a dyno varies by a few percent from one dyno run to the next, so a change of 2–3 % is within that margin.'

export type ComparisonSide = 'before' | 'after'

/** The fields of a stored pull the comparison reads (PullResult in analyse.ts). */
export interface ComparisonPullInput {
  index: number
  ambientTempC: number
  meanChargeTempC: number
  meanDeltaOverAmbientK: number
  meanManifoldKpa: number | null
  pressureRatio: number | null
  preCoolerTempC: number | null
  effectiveness: number | null
  effectivenessSource: 'measured' | 'estimated' | null
  meanRpm: number | null
}

export interface ComparisonLogInput {
  logId: number
  /** How the log is named to people: its day and file. */
  label: string
  pulls: readonly ComparisonPullInput[]
}

export interface BeforeAfterOptions {
  referenceAmbientC?: number
  boostToleranceKpa?: number
  rpmTolerance?: number
  compressorEfficiency?: number
  /** Rated engine power, kW: the recovered power is also given in kW. */
  ratedPowerKw?: number | null
}

export type ComparisonInputErrorCode = 'EMPTY_SIDE' | 'SAME_LOG' | 'NO_PULLS' | 'NO_EFFECTIVENESS' | 'NO_MATCH'

/** The user's choice of logs cannot be compared; the message says why and what to do. */
export class ComparisonInputError extends Error {
  constructor(public code: ComparisonInputErrorCode, message: string, public logId?: number) {
    super(message)
    this.name = 'ComparisonInputError'
  }
}

export interface ComparedPull {
  side: ComparisonSide
  logId: number
  /** 1-based, as the report numbers pulls */
  pull: number
  ambientTempC: number
  chargeTempC: number
  deltaOverAmbientK: number
  effectiveness: number | null
  effectivenessSource: 'measured' | 'estimated' | null
  boostKpa: number | null
  rpm: number | null
  matched: boolean
  /** This pull's effectiveness applied at the reference ambient (null without effectiveness). */
  chargeTempAtReferenceC: number | null
}

export interface UnmatchedPull {
  side: ComparisonSide
  logId: number
  logLabel: string
  pull: number
  reason: string
}

export interface SideSummary {
  logIds: number[]
  /** matched pulls used for the statistics */
  pullCount: number
  /** every pull of the side's logs */
  totalPullCount: number
  meanEffectiveness: number
  effectivenessInterval: [number, number] | null
  effectivenessSource: 'measured' | 'estimated' | 'mixed'
  meanDeltaOverAmbientK: number
  deltaOverAmbientInterval: [number, number] | null
  /** mean ambient temperature of the matched pulls */
  ambientTempC: number
  /** mean raw charge temperature of the matched pulls, as logged */
  meanChargeTempC: number
  chargeTempAtReferenceC: number | null
}

export type VerdictTone = 'better' | 'worse' | 'noise' | 'too-few'

export interface BeforeAfterResult {
  referenceAmbientC: number
  /** mean pressure ratio of the matched pulls, both sides: the load both cores are judged at */
  referencePressureRatio: number | null
  preCoolerAtReferenceC: number | null
  before: SideSummary
  after: SideSummary
  effectivenessGain: number
  deltaOverAmbientChangeK: number
  chargeTempAtReferenceChangeK: number | null
  densityGainPct: number | null
  powerRecoveredPct: number | null
  powerRecoveredKw: number | null
  intervals: {
    effectivenessGain: [number, number] | null
    deltaOverAmbientChangeK: [number, number] | null
    chargeTempAtReferenceChangeK: [number, number] | null
    powerRecoveredPct: [number, number] | null
  }
  /** Welch degrees of freedom of the two differences */
  degreesOfFreedom: { effectivenessGain: number | null, deltaOverAmbientChangeK: number | null }
  pulls: ComparedPull[]
  unmatchedPulls: UnmatchedPull[]
  verdict: string
  verdictTone: VerdictTone
  dynoSpreadNote: string
  warnings: { code: 'raw-misleads' | 'different-days' | 'estimated-effectiveness' | 'no-reference', message: string }[]
  basis: string
  matching: { boostToleranceKpa: number, rpmTolerance: number }
}

const finiteOrNull = (value: number): number | null => (Number.isFinite(value) ? value : null)
const pair = (low: number, high: number): [number, number] | null => (Number.isFinite(low) && Number.isFinite(high) ? [low, high] : null)
const average = (values: readonly number[]) => values.reduce((s, v) => s + v, 0) / values.length
const usable = (pull: ComparisonPullInput) => pull.effectiveness !== null && Number.isFinite(pull.effectiveness)

function checkInputs(before: readonly ComparisonLogInput[], after: readonly ComparisonLogInput[]) {
  if (before.length === 0 || after.length === 0) {
    throw new ComparisonInputError('EMPTY_SIDE', `Choose at least one log for the ${before.length === 0 ? 'before' : 'after'} side.`)
  }
  const beforeIds = new Set(before.map(l => l.logId))
  const both = after.find(l => beforeIds.has(l.logId))
  if (both) {
    throw new ComparisonInputError('SAME_LOG', `The log ${both.label} is on both sides. A log belongs either before or after the change: take it off one side.`, both.logId)
  }
  for (const log of [...before, ...after]) {
    if (log.pulls.length === 0) {
      throw new ComparisonInputError('NO_PULLS', `The log ${log.label} has no pulls, so it says nothing about the core. Leave it out, or mark a pull on its report first.`, log.logId)
    }
    if (!log.pulls.some(usable)) {
      const why = log.pulls.every(p => p.preCoolerTempC === null)
        ? 'it has no pre-cooler temperature and no boost reading to estimate one from'
        : 'the air before the intercooler was barely warmer than the ambient temperature (less than 1 K), so the ratio is undefined'
      throw new ComparisonInputError('NO_EFFECTIVENESS', `The effectiveness of the log ${log.label} cannot be worked out: ${why}. Map the boost or pre-cooler temperature column on its report, or leave this log out.`, log.logId)
    }
  }
}

function withinBand(a: ComparisonPullInput, b: ComparisonPullInput, boostTol: number, rpmTol: number) {
  const boostOk = a.meanManifoldKpa === null || b.meanManifoldKpa === null || Math.abs(a.meanManifoldKpa - b.meanManifoldKpa) <= boostTol
  const rpmOk = a.meanRpm === null || b.meanRpm === null || Math.abs(a.meanRpm - b.meanRpm) <= rpmTol
  return boostOk && rpmOk
}

function describeLoad(pull: ComparisonPullInput) {
  const parts = []
  if (pull.meanManifoldKpa !== null) parts.push(`boost ${Math.round(pull.meanManifoldKpa)} kPa`)
  if (pull.meanRpm !== null) parts.push(`${Math.round(pull.meanRpm)} rpm`)
  return parts.join(', ')
}

/**
 * Match pulls across the sides by boost and engine speed. A pull without a usable effectiveness
 * is unmatched (it cannot be compared); a pull is matched when the other side has at least one
 * usable pull within both bands (a missing boost or rpm reading does not exclude a pull).
 */
export function matchPulls(
  before: readonly ComparisonLogInput[],
  after: readonly ComparisonLogInput[],
  boostToleranceKpa = BOOST_TOLERANCE_KPA,
  rpmTolerance = RPM_TOLERANCE,
): { matched: Record<ComparisonSide, Array<{ log: ComparisonLogInput, pull: ComparisonPullInput }>>, unmatched: UnmatchedPull[] } {
  const sides = { before, after }
  const matched: Record<ComparisonSide, Array<{ log: ComparisonLogInput, pull: ComparisonPullInput }>> = { before: [], after: [] }
  const unmatched: UnmatchedPull[] = []
  for (const side of ['before', 'after'] as const) {
    const other = side === 'before' ? 'after' : 'before'
    const candidates = sides[other].flatMap(l => l.pulls.filter(usable))
    for (const log of sides[side]) {
      for (const pull of log.pulls) {
        const entry = { side, logId: log.logId, logLabel: log.label, pull: pull.index + 1 }
        if (!usable(pull)) {
          unmatched.push({ ...entry, reason: 'Effectiveness could not be worked out for this pull (no pre-cooler temperature, or it was barely above the ambient temperature).' })
        }
        else if (!candidates.some(c => withinBand(pull, c, boostToleranceKpa, rpmTolerance))) {
          unmatched.push({ ...entry, reason: `No ${other} pull at a similar load (${describeLoad(pull)}; within ±${boostToleranceKpa} kPa and ±${rpmTolerance} rpm).` })
        }
        else {
          matched[side].push({ log, pull })
        }
      }
    }
  }
  return { matched, unmatched }
}

/** Charge temperature at a reference ambient, K: T2 − ε·(T2 − T_ref). */
export function chargeTempAtReferenceK(referenceK: number, pressureRatio: number, effectiveness: number, compressorEfficiency = DEFAULT_COMPRESSOR_EFFICIENCY): number {
  const preK = compressorOutletTempK(referenceK, pressureRatio, compressorEfficiency)
  return preK - effectiveness * (preK - referenceK)
}

function sourceOf(pulls: readonly ComparisonPullInput[]): SideSummary['effectivenessSource'] {
  const sources = new Set(pulls.map(p => p.effectivenessSource))
  return sources.size === 1 && sources.has('measured') ? 'measured' : sources.size === 1 && sources.has('estimated') ? 'estimated' : 'mixed'
}

const signed = (value: number, digits: number) => `${value >= 0 ? '+' : '−'}${Math.abs(value).toFixed(digits)}`
const points = (value: number) => `${signed(value * 100, 1)} points`

/** Compare before and after logs of one car at one reference ambient. */
export function compareCores(before: readonly ComparisonLogInput[], after: readonly ComparisonLogInput[], options: BeforeAfterOptions = {}): BeforeAfterResult {
  const referenceAmbientC = options.referenceAmbientC ?? DEFAULT_REFERENCE_AMBIENT_C
  const boostToleranceKpa = options.boostToleranceKpa ?? BOOST_TOLERANCE_KPA
  const rpmTolerance = options.rpmTolerance ?? RPM_TOLERANCE
  const efficiency = options.compressorEfficiency ?? DEFAULT_COMPRESSOR_EFFICIENCY
  checkInputs(before, after)

  const { matched, unmatched } = matchPulls(before, after, boostToleranceKpa, rpmTolerance)
  if (matched.before.length === 0 || matched.after.length === 0) {
    throw new ComparisonInputError('NO_MATCH', 'No before pull matches an after pull at a similar boost and engine speed, so the cores cannot be compared at the same load. Choose logs driven the same way (same gear, same road), or add logs.')
  }
  const pullsOf = (side: ComparisonSide) => matched[side].map(m => m.pull)
  const stats = {
    effectiveness: compareSamples(pullsOf('before').map(p => p.effectiveness!), pullsOf('after').map(p => p.effectiveness!)),
    delta: compareSamples(pullsOf('before').map(p => p.meanDeltaOverAmbientK), pullsOf('after').map(p => p.meanDeltaOverAmbientK)),
  }

  // One load for both cores: the matched pulls' mean pressure ratio.
  const ratios = [...pullsOf('before'), ...pullsOf('after')].map(p => p.pressureRatio).filter((r): r is number => r !== null && Number.isFinite(r) && r > 1)
  const referencePressureRatio = ratios.length ? average(ratios) : null
  const referenceK = referenceAmbientC + KELVIN_OFFSET
  const atReference = (effectiveness: number) => referencePressureRatio === null ? Number.NaN : chargeTempAtReferenceK(referenceK, referencePressureRatio, effectiveness, efficiency)
  const preCoolerAtReferenceK = referencePressureRatio === null ? Number.NaN : compressorOutletTempK(referenceK, referencePressureRatio, efficiency)

  const summarise = (side: ComparisonSide, logs: readonly ComparisonLogInput[], e: SampleComparison['before'], d: SampleComparison['before']): SideSummary => {
    const pulls = pullsOf(side)
    return {
      logIds: logs.map(l => l.logId),
      pullCount: pulls.length,
      totalPullCount: logs.reduce((s, l) => s + l.pulls.length, 0),
      meanEffectiveness: e.mean,
      effectivenessInterval: pair(e.low, e.high),
      effectivenessSource: sourceOf(pulls),
      meanDeltaOverAmbientK: d.mean,
      deltaOverAmbientInterval: pair(d.low, d.high),
      ambientTempC: average(pulls.map(p => p.ambientTempC)),
      meanChargeTempC: average(pulls.map(p => p.meanChargeTempC)),
      chargeTempAtReferenceC: finiteOrNull(atReference(e.mean) - KELVIN_OFFSET),
    }
  }
  const sideBefore = summarise('before', before, stats.effectiveness.before, stats.delta.before)
  const sideAfter = summarise('after', after, stats.effectiveness.after, stats.delta.after)

  const gain = stats.effectiveness.difference
  const spanK = preCoolerAtReferenceK - referenceK
  const beforeRefK = atReference(sideBefore.meanEffectiveness)
  // After-core charge temperature for an effectiveness gain g: T_before,ref − g·(T2 − T_ref).
  const afterRefK = (g: number) => beforeRefK - g * spanK
  const densityGain = (g: number) => 100 * (beforeRefK / afterRefK(g) - 1)
  const chargeChangeK = referencePressureRatio === null ? null : -gain.mean * spanK
  const densityGainPct = referencePressureRatio === null ? null : densityGain(gain.mean)
  const gainInterval = pair(gain.low, gain.high)

  const matchedPulls = new Set([...matched.before, ...matched.after].map(m => m.pull))
  const pulls: ComparedPull[] = (['before', 'after'] as const).flatMap(side => (side === 'before' ? before : after).flatMap(log => log.pulls.map(p => ({
    side,
    logId: log.logId,
    pull: p.index + 1,
    ambientTempC: p.ambientTempC,
    chargeTempC: p.meanChargeTempC,
    deltaOverAmbientK: p.meanDeltaOverAmbientK,
    effectiveness: usable(p) ? p.effectiveness : null,
    effectivenessSource: p.effectivenessSource,
    boostKpa: p.meanManifoldKpa,
    rpm: p.meanRpm,
    matched: matchedPulls.has(p),
    chargeTempAtReferenceC: usable(p) ? finiteOrNull(atReference(p.effectiveness!) - KELVIN_OFFSET) : null,
  }))))

  const warnings: BeforeAfterResult['warnings'] = []
  const ambientDiffK = sideAfter.ambientTempC - sideBefore.ambientTempC
  const rawDiffK = sideAfter.meanChargeTempC - sideBefore.meanChargeTempC
  if (ambientDiffK > 0 && rawDiffK > -1 && gain.mean > 0) {
    warnings.push({
      code: 'raw-misleads',
      message: `The raw charge temperatures mislead here. The after day was ${ambientDiffK.toFixed(1)} K warmer, so the after pulls logged ${rawDiffK >= 0 ? `${rawDiffK.toFixed(1)} K hotter` : 'about the same'} charge air on average, yet the after core removes more of the turbo's heat (effectiveness ${points(gain.mean)}). Judge the cores by effectiveness and by the charge temperature at the reference ambient, not by the logged charge temperature.`,
    })
  }
  else if (Math.abs(ambientDiffK) > AMBIENT_TOLERANCE_K) {
    warnings.push({ code: 'different-days', message: `The ambient temperature differed by ${Math.abs(ambientDiffK).toFixed(1)} K between the days. The logged charge temperatures are not comparable on their own; the figures below compare effectiveness, temperature over ambient and the charge temperature at ${referenceAmbientC} °C.` })
  }
  if (sideBefore.effectivenessSource !== 'measured' || sideAfter.effectivenessSource !== 'measured') {
    warnings.push({ code: 'estimated-effectiveness', message: 'Some effectiveness values are estimated from boost (no pre-cooler sensor), and estimated values read a little low. Where one side is measured and the other estimated, part of the difference may come from that.' })
  }
  if (referencePressureRatio === null) {
    warnings.push({ code: 'no-reference', message: 'No boost reading on the matched pulls, so the charge temperature at the reference ambient and the power recovered cannot be predicted.' })
  }

  const n = Math.min(sideBefore.pullCount, sideAfter.pullCount)
  let verdictTone: VerdictTone
  let verdict: string
  const intervalText = gainInterval ? ` (95 % interval ${points(gainInterval[0])} to ${points(gainInterval[1])})` : ''
  if (n < 2 || !gainInterval) {
    verdictTone = 'too-few'
    verdict = `Too few matched pulls for an interval: effectiveness changed by ${points(gain.mean)}, but at least two pulls a side are needed to say whether that is more than pull-to-pull spread. Log a few more pulls.`
  }
  else if (stats.effectiveness.differenceExcludesZero) {
    const better = gain.mean > 0
    verdictTone = better ? 'better' : 'worse'
    const reference = chargeChangeK !== null && densityGainPct !== null
      ? ` At ${referenceAmbientC} °C ambient the engine would breathe charge air ${Math.abs(chargeChangeK).toFixed(1)} K ${better ? 'cooler' : 'hotter'}: about ${Math.abs(densityGainPct).toFixed(1)} % ${better ? 'more' : 'less'} power at the same boost (upper bound).`
      : ''
    verdict = `The after core works ${better ? 'better' : 'worse'}: effectiveness ${points(gain.mean)}${intervalText}, and the charge air sits ${Math.abs(stats.delta.difference.mean).toFixed(1)} K ${stats.delta.difference.mean < 0 ? 'less' : 'more'} above the ambient temperature.${reference}`
    if (densityGainPct !== null && Math.abs(densityGainPct) < 3) {
      verdict += ' A change this small would be within the noise of a dyno run.'
    }
  }
  else {
    verdictTone = 'noise'
    verdict = `The difference is within the noise: effectiveness changed by ${points(gain.mean)}, but its 95 % interval, ${points(gainInterval[0])} to ${points(gainInterval[1])}, includes no change at all. More pulls on each side would narrow it.`
  }

  return {
    referenceAmbientC,
    referencePressureRatio,
    preCoolerAtReferenceC: finiteOrNull(preCoolerAtReferenceK - KELVIN_OFFSET),
    before: sideBefore,
    after: sideAfter,
    effectivenessGain: gain.mean,
    deltaOverAmbientChangeK: stats.delta.difference.mean,
    chargeTempAtReferenceChangeK: chargeChangeK,
    densityGainPct,
    powerRecoveredPct: densityGainPct,
    powerRecoveredKw: densityGainPct !== null && options.ratedPowerKw ? options.ratedPowerKw * densityGainPct / 100 : null,
    intervals: {
      effectivenessGain: gainInterval,
      deltaOverAmbientChangeK: pair(stats.delta.difference.low, stats.delta.difference.high),
      chargeTempAtReferenceChangeK: gainInterval && referencePressureRatio !== null ? [-gainInterval[1] * spanK, -gainInterval[0] * spanK] : null,
      powerRecoveredPct: gainInterval && referencePressureRatio !== null ? [densityGain(gainInterval[0]), densityGain(gainInterval[1])] : null,
    },
    degreesOfFreedom: { effectivenessGain: finiteOrNull(gain.df), deltaOverAmbientChangeK: finiteOrNull(stats.delta.difference.df) },
    pulls,
    unmatchedPulls: unmatched,
    verdict,
    verdictTone,
    dynoSpreadNote: DYNO_SPREAD_NOTE,
    warnings,
    basis: `Both cores judged at ${referenceAmbientC} °C ambient and the matched pulls' mean boost (pressure ratio ${referencePressureRatio?.toFixed(2) ?? 'unknown'}), with a compressor efficiency of ${efficiency.toFixed(2)}. Power follows charge density at the same boost (air-limited engine): an upper bound.`,
    matching: { boostToleranceKpa, rpmTolerance },
  }
}
