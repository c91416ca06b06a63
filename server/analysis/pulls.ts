// Pull detection: spans at (nearly) full load held long enough for the intercooler to matter.
// The pedal is used when the log has it: a diesel's throttle flap sits near 83 % while running
// and never marks a pull, and a petrol throttle may be opened by the ECU for other reasons.
import type { LogChannels } from '../../shared/quantities/channels'
import { lowerBound, withDefaults } from './masks'
import { LogImportError } from './import/errors'

export interface PullOptions {
  /** Pedal (or throttle) at or above this marks full load, %. Given → the rule is set by hand. */
  thresholdPct?: number
  /** A pull must be held at least this long, s (default 3). */
  minDurationS: number
  /** Dips below the threshold shorter than this do not end a pull, s (common practice: gear changes are longer). */
  gapToleranceS: number
  /** Force the load channel; by default pedal if present, else throttle. */
  channel?: 'pedal' | 'throttle'
  /** Below this the engine is off and no pull can happen, rpm. */
  engineOffRpm: number
  /** Barometric pressure for "boost near peak" (gauge boost = MAP − baro), Pa. */
  baroPa: number
  /** Add sustained pulls (long stretches at high boost) found without the pedal (default true). */
  sustained: boolean
}

// The numbers of the full-load rule are workshop judgement (common practice, no source):
// - a pedal that tops out below 90 % (many cars report 75–85 % at full pedal, reference sheet §13)
//   is judged against its own highest reading: 90 % of it;
// - "boost near peak" is gauge boost at ≥ 75 % of the log's peak gauge boost (peak = the 99.5th
//   percentile of running samples, so one stray reading does not set it);
// - calculated engine load corroborates on an engine without boost when it is at ≥ 85 % of its top;
// - a stretch at high boost held ≥ 8 s without the pedal rule is a sustained pull (a motorway climb,
//   towing); a pedal pull held ≥ 20 s is one too.
export const FULL_LOAD_RULE = {
  absoluteThresholdPct: 90,
  relativeShare: 0.9,
  boostNearPeakShare: 0.75,
  peakQuantile: 0.995,
  minPeakBoostPa: 20_000,
  loadShare: 0.85,
  sustainedBoostMinS: 8,
  sustainedPullMinS: 20,
} as const

export const DEFAULT_PULL_OPTIONS: Readonly<PullOptions> = {
  minDurationS: 3,
  gapToleranceS: 0.5,
  engineOffRpm: 300,
  baroPa: 101_325,
  sustained: true,
}

export type PullOrigin = 'auto' | 'added' | 'adjusted'
/** A hard acceleration, or a sustained pull (a long stretch at high boost). */
export type PullKind = 'sprint' | 'sustained'

/** A pull as a sample range [startIndex, endIndex) and the times of its first and last sample. */
export interface PullWindow {
  startIndex: number
  endIndex: number
  startS: number
  endS: number
  origin: PullOrigin
  /** Index among the automatically detected pulls (what remove/adjust edits name); null for added pulls. */
  autoIndex: number | null
  kind: PullKind
}

/** A full-load rule set by hand (kept with the pull edits). */
export interface ManualPullRule {
  channel?: 'pedal' | 'throttle'
  /** Load at or above this is full load, %. */
  thresholdPct: number
  /** Also count long stretches at high boost as sustained pulls (default true). */
  sustained?: boolean
}

export interface PullEdits {
  /** Pulls to add, s from the start of the log. */
  add?: { startS: number, endS: number }[]
  /** Indexes (0-based, as in the automatic result) of pulls to drop. */
  remove?: number[]
  /** Move the start and/or end of an automatic pull. */
  adjust?: { index: number, startS?: number, endS?: number }[]
  /** The full-load rule set by hand instead of the automatic one. */
  rule?: ManualPullRule
  /** Keep pulls that lie mostly in a stretch left out for a sensor fault (the user trusts them). */
  keepLeftOut?: boolean
}

/** Which rule found the pulls: reported in the analysis and shown in the report. */
export interface FullLoadRule {
  /** threshold: load ≥ a fixed %; relative: load ≥ a share of its top, corroborated; boost: boost only. */
  mode: 'threshold' | 'relative' | 'boost' | 'none'
  source: 'automatic' | 'by hand'
  channel: 'pedal' | 'throttle' | null
  /** Load at or above this counts, % (null when the load channel is not used). */
  thresholdPct: number | null
  /** Highest load reading of the log while running, %. */
  channelMaxPct: number | null
  corroboration: 'boost' | 'load' | null
  /** Manifold pressure counted as "boost near peak", kPa abs (null without boost). */
  boostNearPeakKpa: number | null
  /** Peak manifold pressure of the log (99.5th percentile while running), kPa abs. */
  peakManifoldKpa: number | null
  /** Calculated engine load counted as full load, % (null unless it corroborates). */
  engineLoadPct: number | null
  sustained: { boostKpa: number, minS: number, pullMinS: number } | null
  /** The rule in plain words ("pedal at ≥ 90 % of its highest reading, 78.8 %, with boost near peak"). */
  description: string
}

export interface PullDetection {
  windows: PullWindow[]
  loadChannel: 'pedal' | 'throttle' | null
  /** Highest load value seen, % (to explain "no pulls found"). */
  maxLoadPct: number
  rule: FullLoadRule
}

const CHANNEL_WORDS = { pedal: 'accelerator pedal', throttle: 'throttle' } as const
const fmt1 = (v: number) => (Math.round(v * 10) / 10).toFixed(1)

/** Value at quantile q of the finite samples where `keep` holds. */
function quantileWhere(values: Float32Array, keep: (i: number) => boolean, q: number): number {
  const picked: number[] = []
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!
    if (Number.isFinite(v) && keep(i)) picked.push(v)
  }
  if (picked.length === 0) return Number.NaN
  picked.sort((a, b) => a - b)
  return picked[Math.min(picked.length - 1, Math.floor(q * picked.length))]!
}

/** Windows where `high(i)` holds, bridging dips up to the gap tolerance, kept when ≥ minS long. */
function windowsWhere(t: Float64Array, high: (i: number) => boolean, minS: number, gapToleranceS: number, kind: (durationS: number) => PullKind): PullWindow[] {
  const n = t.length
  const windows: PullWindow[] = []
  let start = -1
  let lastHigh = -1
  const close = () => {
    if (start >= 0 && t[lastHigh]! - t[start]! >= minS) {
      const durationS = t[lastHigh]! - t[start]!
      windows.push({ startIndex: start, endIndex: lastHigh + 1, startS: t[start]!, endS: t[lastHigh]!, origin: 'auto', autoIndex: null, kind: kind(durationS) })
    }
    start = -1
  }
  for (let i = 0; i < n; i++) {
    if (high(i)) {
      if (start < 0) start = i
      lastHigh = i
    }
    else if (start >= 0 && t[i]! - t[lastHigh]! > gapToleranceS) {
      close()
    }
  }
  close()
  return windows
}

/**
 * Find the pulls and say which rule found them. With a pedal (or throttle) that reaches 90 %:
 * load ≥ 90 %. When it never does: load ≥ 90 % of its own highest reading, corroborated by boost
 * near the log's peak (or by calculated engine load on an engine without boost). Long stretches at
 * high boost that the load rule did not find are added as sustained pulls. A threshold given by
 * hand replaces the automatic choice.
 */
export function detectPulls(channels: LogChannels, options: Partial<PullOptions> = {}): PullDetection {
  const o = withDefaults(DEFAULT_PULL_OPTIONS, options)
  if (o.thresholdPct !== undefined && !(o.thresholdPct > 0 && o.thresholdPct <= 100)) {
    throw new LogImportError('BAD_OPTION', `The full-load threshold must be between 1 and 100 %; got ${String(o.thresholdPct)}.`)
  }
  if (!(o.baroPa > 0) || !Number.isFinite(o.baroPa)) {
    throw new LogImportError('IMPOSSIBLE_INPUT', `The barometric pressure for finding pulls must be a positive number of pascals; got ${String(o.baroPa)}.`)
  }
  const loadChannel = o.channel ?? (channels.pedalPct ? 'pedal' : channels.throttlePct ? 'throttle' : null)
  const load = loadChannel === 'pedal' ? channels.pedalPct : loadChannel === 'throttle' ? channels.throttlePct : undefined
  const t = channels.timeS
  const n = t.length
  const rpm = channels.rpm
  const running = (i: number) => !rpm || !(rpm[i]! < o.engineOffRpm)
  const byHand = o.thresholdPct !== undefined

  let maxLoadPct = Number.NEGATIVE_INFINITY
  if (load) {
    for (let i = 0; i < n; i++) if (running(i) && load[i]! > maxLoadPct) maxLoadPct = load[i]!
  }
  const map = channels.manifoldPressurePa
  const peakMap = map ? quantileWhere(map, running, FULL_LOAD_RULE.peakQuantile) : Number.NaN
  const peakGauge = peakMap - o.baroPa
  const boosted = map !== undefined && peakGauge >= FULL_LOAD_RULE.minPeakBoostPa
  const nearPeakPa = boosted ? o.baroPa + FULL_LOAD_RULE.boostNearPeakShare * peakGauge : Number.NaN
  const engineLoad = channels.engineLoadPct
  const engineLoadTop = engineLoad ? quantileWhere(engineLoad, running, FULL_LOAD_RULE.peakQuantile) : Number.NaN
  const engineLoadPct = Number.isFinite(engineLoadTop) && engineLoadTop > 0 ? FULL_LOAD_RULE.loadShare * engineLoadTop : Number.NaN

  let mode: FullLoadRule['mode'] = 'none'
  let thresholdPct = Number.NaN
  let corroboration: FullLoadRule['corroboration'] = null
  let loadWindows: PullWindow[] = []
  const sustainedPullMinS = FULL_LOAD_RULE.sustainedPullMinS
  const pullKind = (d: number): PullKind => (d >= sustainedPullMinS ? 'sustained' : 'sprint')
  if (load && loadChannel && Number.isFinite(maxLoadPct)) {
    if (byHand || maxLoadPct >= FULL_LOAD_RULE.absoluteThresholdPct) {
      mode = 'threshold'
      thresholdPct = o.thresholdPct ?? FULL_LOAD_RULE.absoluteThresholdPct
      loadWindows = windowsWhere(t, i => load[i]! >= thresholdPct && running(i), o.minDurationS, o.gapToleranceS, pullKind)
    }
    else if (maxLoadPct > 0) {
      mode = 'relative'
      thresholdPct = FULL_LOAD_RULE.relativeShare * maxLoadPct
      corroboration = boosted ? 'boost' : Number.isFinite(engineLoadPct) ? 'load' : null
      const corroborated = corroboration === 'boost'
        ? (i: number) => map![i]! >= nearPeakPa
        : corroboration === 'load'
          ? (i: number) => engineLoad![i]! >= engineLoadPct
          : () => true
      loadWindows = windowsWhere(t, i => load[i]! >= thresholdPct && running(i) && corroborated(i), o.minDurationS, o.gapToleranceS, pullKind)
    }
  }
  // Sustained pulls: high boost held long, where the load rule found nothing. Without a load
  // channel, boost near peak is the whole rule (held as long as an ordinary pull).
  let boostWindows: PullWindow[] = []
  const useBoost = boosted && (o.sustained || !load)
  if (useBoost) {
    const minS = load ? FULL_LOAD_RULE.sustainedBoostMinS : o.minDurationS
    boostWindows = windowsWhere(t, i => map![i]! >= nearPeakPa && running(i), minS, o.gapToleranceS, d => (load ? 'sustained' : pullKind(d)))
      .filter(w => !loadWindows.some(l => l.startS <= w.endS && w.startS <= l.endS))
    if (!load) mode = 'boost'
  }
  const windows = [...loadWindows, ...boostWindows].sort((a, b) => a.startS - b.startS)
  windows.forEach((w, i) => {
    w.autoIndex = i
  })

  const peakManifoldKpa = Number.isFinite(peakMap) ? Math.round(peakMap / 100) / 10 : null
  const boostNearPeakKpa = boosted ? Math.round(nearPeakPa / 100) / 10 : null
  const words = loadChannel ? CHANNEL_WORDS[loadChannel] : ''
  let description: string
  if (mode === 'threshold') {
    description = `${words} at ≥ ${fmt1(thresholdPct)} %${byHand ? ' (set by hand)' : ''}`
  }
  else if (mode === 'relative') {
    const also = corroboration === 'boost'
      ? `, with boost near peak (≥ ${boostNearPeakKpa} kPa abs)`
      : corroboration === 'load' ? `, with calculated engine load ≥ ${fmt1(engineLoadPct)} %` : ''
    description = `${words} at ≥ 90 % of its highest reading, ${fmt1(maxLoadPct)} % (so ≥ ${fmt1(thresholdPct)} %)${also}`
  }
  else if (mode === 'boost') {
    description = `boost near peak (≥ ${boostNearPeakKpa} kPa abs) held ${o.minDurationS} s or more; the log has no pedal or throttle`
  }
  else {
    description = load ? `${words} never moved above 0 %` : 'no pedal, throttle or boost channel: pulls can only be marked by hand'
  }
  const sustained = useBoost && load
    ? { boostKpa: boostNearPeakKpa!, minS: FULL_LOAD_RULE.sustainedBoostMinS, pullMinS: sustainedPullMinS }
    : null
  if (sustained) description += `; sustained pulls: boost ≥ ${sustained.boostKpa} kPa abs held ${sustained.minS} s or more`
  return {
    windows,
    loadChannel: loadChannel && load ? loadChannel : null,
    maxLoadPct: Number.isFinite(maxLoadPct) ? maxLoadPct : Number.NaN,
    rule: {
      mode,
      source: byHand ? 'by hand' : 'automatic',
      channel: loadChannel && load ? loadChannel : null,
      thresholdPct: Number.isFinite(thresholdPct) ? Math.round(thresholdPct * 10) / 10 : null,
      channelMaxPct: Number.isFinite(maxLoadPct) ? Math.round(maxLoadPct * 10) / 10 : null,
      corroboration,
      boostNearPeakKpa,
      peakManifoldKpa,
      engineLoadPct: corroboration === 'load' ? Math.round(engineLoadPct * 10) / 10 : null,
      sustained,
      description: description.charAt(0).toUpperCase() + description.slice(1),
    },
  }
}

function windowFromTimes(timeS: Float64Array, startS: number, endS: number, origin: PullOrigin, autoIndex: number | null, kind: PullKind): PullWindow {
  const startIndex = lowerBound(timeS, startS)
  const endIndex = lowerBound(timeS, endS + 1e-9)
  return { startIndex, endIndex, startS: timeS[startIndex] ?? startS, endS: timeS[Math.max(startIndex, endIndex - 1)] ?? endS, origin, autoIndex, kind }
}

function checkSpan(timeS: Float64Array, startS: unknown, endS: unknown, what: string): asserts startS is number {
  const durationS = timeS.length > 0 ? timeS[timeS.length - 1]! : 0
  if (typeof startS !== 'number' || typeof endS !== 'number' || !Number.isFinite(startS) || !Number.isFinite(endS)) {
    throw new LogImportError('BAD_PULL_EDIT', `${what}: start and end must be numbers of seconds from the start of the log.`)
  }
  if (endS <= startS) throw new LogImportError('BAD_PULL_EDIT', `${what}: the end (${endS} s) must be after the start (${startS} s).`)
  if (startS < 0 || endS > durationS + 1e-6) {
    throw new LogImportError('BAD_PULL_EDIT', `${what}: ${startS}–${endS} s is outside the log (0–${durationS.toFixed(1)} s).`)
  }
}

/**
 * Apply a tuner's corrections to the automatic pulls: remove and adjust refer to the automatic
 * indexes; added pulls are inserted; the result is sorted by start time.
 */
export function applyPullEdits(timeS: Float64Array, auto: readonly PullWindow[], edits: PullEdits | undefined): PullWindow[] {
  if (!edits) return [...auto]
  const count = auto.length
  const checkIndex = (index: unknown, what: string): number => {
    if (typeof index !== 'number' || !Number.isInteger(index) || index < 0 || index >= count) {
      // Counted from 1, as the report numbers its pulls; the request itself counts from 0.
      const named = typeof index === 'number' && Number.isInteger(index) ? `pull ${index + 1}` : 'that pull'
      const found = count === 0 ? 'the full-load rule found no pulls in this log' : `the full-load rule found ${count === 1 ? 'one pull' : `pulls 1 to ${count}`} in this log`
      throw new LogImportError('BAD_PULL_EDIT', `${what}: there is no ${named}; ${found}. Reload the report and choose a pull from its table.`)
    }
    return index
  }
  const removed = new Set((edits.remove ?? []).map(index => checkIndex(index, 'Remove pull')))
  const result: PullWindow[] = []
  const adjusted = new Map<number, { startS?: number, endS?: number }>()
  for (const adjust of edits.adjust ?? []) adjusted.set(checkIndex(adjust.index, 'Adjust pull'), adjust)
  auto.forEach((window, index) => {
    if (removed.has(index)) return
    const change = adjusted.get(index)
    if (!change) {
      result.push(window)
      return
    }
    const startS = change.startS ?? window.startS
    const endS = change.endS ?? window.endS
    checkSpan(timeS, startS, endS, `Adjust pull ${index}`)
    result.push(windowFromTimes(timeS, startS, endS, 'adjusted', index, window.kind))
  })
  for (const add of edits.add ?? []) {
    checkSpan(timeS, add.startS, add.endS, 'Add pull')
    result.push(windowFromTimes(timeS, add.startS, add.endS, 'added', null, add.endS - add.startS >= FULL_LOAD_RULE.sustainedPullMinS ? 'sustained' : 'sprint'))
  }
  return result.filter(w => w.endIndex > w.startIndex).sort((a, b) => a.startS - b.startS)
}
