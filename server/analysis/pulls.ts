// Pull detection: spans at (nearly) full load held long enough for the intercooler to matter.
// The pedal is used when the log has it: a diesel's throttle flap sits near 83 % while running
// and never marks a pull, and a petrol throttle may be opened by the ECU for other reasons.
import type { LogChannels } from './channels'
import { lowerBound, withDefaults } from './masks'
import { LogImportError } from './import/errors'

export interface PullOptions {
  /** Pedal (or throttle) at or above this marks full load, % (default 90). */
  thresholdPct: number
  /** A pull must be held at least this long, s (default 3). */
  minDurationS: number
  /** Dips below the threshold shorter than this do not end a pull, s (common practice: gear changes are longer). */
  gapToleranceS: number
  /** Force the load channel; by default pedal if present, else throttle. */
  channel?: 'pedal' | 'throttle'
  /** Below this the engine is off and no pull can happen, rpm. */
  engineOffRpm: number
}

export const DEFAULT_PULL_OPTIONS: Readonly<PullOptions> = {
  thresholdPct: 90,
  minDurationS: 3,
  gapToleranceS: 0.5,
  engineOffRpm: 300,
}

export type PullOrigin = 'auto' | 'added' | 'adjusted'

/** A pull as a sample range [startIndex, endIndex) and the times of its first and last sample. */
export interface PullWindow {
  startIndex: number
  endIndex: number
  startS: number
  endS: number
  origin: PullOrigin
  /** Index among the automatically detected pulls (what remove/adjust edits name); null for added pulls. */
  autoIndex: number | null
}

export interface PullEdits {
  /** Pulls to add, s from the start of the log. */
  add?: { startS: number, endS: number }[]
  /** Indexes (0-based, as in the automatic result) of pulls to drop. */
  remove?: number[]
  /** Move the start and/or end of an automatic pull. */
  adjust?: { index: number, startS?: number, endS?: number }[]
}

export interface PullDetection {
  windows: PullWindow[]
  loadChannel: 'pedal' | 'throttle' | null
  /** Highest load value seen, % (to explain "no pulls found"). */
  maxLoadPct: number
}

export function detectPulls(channels: LogChannels, options: Partial<PullOptions> = {}): PullDetection {
  const o = withDefaults(DEFAULT_PULL_OPTIONS, options)
  const loadChannel = o.channel ?? (channels.pedalPct ? 'pedal' : channels.throttlePct ? 'throttle' : null)
  const load = loadChannel === 'pedal' ? channels.pedalPct : loadChannel === 'throttle' ? channels.throttlePct : undefined
  if (!load || !loadChannel) return { windows: [], loadChannel: null, maxLoadPct: Number.NaN }
  const t = channels.timeS
  const rpm = channels.rpm
  const n = t.length
  const windows: PullWindow[] = []
  let maxLoadPct = Number.NEGATIVE_INFINITY
  let start = -1
  let lastHigh = -1
  const close = () => {
    if (start >= 0 && t[lastHigh]! - t[start]! >= o.minDurationS) {
      windows.push({ startIndex: start, endIndex: lastHigh + 1, startS: t[start]!, endS: t[lastHigh]!, origin: 'auto', autoIndex: windows.length })
    }
    start = -1
  }
  for (let i = 0; i < n; i++) {
    const value = load[i]!
    if (value > maxLoadPct) maxLoadPct = value
    const running = !rpm || !(rpm[i]! < o.engineOffRpm)
    const high = value >= o.thresholdPct && running
    if (high) {
      if (start < 0) start = i
      lastHigh = i
    }
    else if (start >= 0 && t[i]! - t[lastHigh]! > o.gapToleranceS) {
      close()
    }
  }
  close()
  return { windows, loadChannel, maxLoadPct: Number.isFinite(maxLoadPct) ? maxLoadPct : Number.NaN }
}

function windowFromTimes(timeS: Float64Array, startS: number, endS: number, origin: PullOrigin, autoIndex: number | null): PullWindow {
  const startIndex = lowerBound(timeS, startS)
  const endIndex = lowerBound(timeS, endS + 1e-9)
  return { startIndex, endIndex, startS: timeS[startIndex] ?? startS, endS: timeS[Math.max(startIndex, endIndex - 1)] ?? endS, origin, autoIndex }
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
      throw new LogImportError('BAD_PULL_EDIT', `${what}: pull ${String(index)} does not exist; the log has ${count} detected pull(s), numbered 0 to ${count - 1}.`)
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
    result.push(windowFromTimes(timeS, startS, endS, 'adjusted', index))
  })
  for (const add of edits.add ?? []) {
    checkSpan(timeS, add.startS, add.endS, 'Add pull')
    result.push(windowFromTimes(timeS, add.startS, add.endS, 'added', null))
  }
  return result.filter(w => w.endIndex > w.startIndex).sort((a, b) => a.startS - b.startS)
}
