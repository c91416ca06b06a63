// Heat soak across the whole drive, with or without pulls: how far the charge air sits above
// ambient while moving, at cruise and under boost, and the soak events — the charge temperature
// climbing while the car is slow or stopped (traffic, a pit lane) — with how fast it comes back
// down once moving again.
import type { LogChannels } from '../../shared/quantities/channels'
import { toSI } from '../../shared/quantities/units'

// Thresholds are workshop judgement (common practice, no source).
export const DRIVE_RULES = {
  /** Road speed at or above this is moving, m/s (5 km/h). */
  movingMps: toSI(5, 'km/h'),
  /** Below this the car is slow (traffic, a pit lane), m/s (10 km/h). */
  slowMps: toSI(10, 'km/h'),
  /** Gauge boost at or above this is "under boost", Pa. */
  boostedPa: 20_000,
  /** A slow stretch must last this long to soak, s. */
  minSlowS: 20,
  /** A soak event is a climb of at least this much, K. */
  minRiseK: 3,
  /** The peak is looked for this long after moving off too (the sensor and pipes lag), s. */
  peakAfterS: 10,
  /** Recovery: 63 % of the rise gone (one first-order time constant, Newton's law of cooling; common practice). */
  recoveredShare: 1 - Math.exp(-1),
  /** A recovery not seen within this long is reported as none, s. */
  maxRecoveryS: 600,
  /** Longest gap between samples counted as logged time, s (a longer gap is the logger paused). */
  maxStepS: 5,
  /** Temperature-over-ambient levels the time spent above is reported for, K. */
  overAmbientLevelsK: [10, 20, 30],
} as const

export interface SpreadK { median: number, p95: number, max: number }

export interface SoakEvent {
  startS: number
  endS: number
  riseK: number
  recoveryS: number | null
}

/** The `drive` contract of issue 10. */
export interface DriveSummary {
  runningS: number
  movingS: number
  boostedS: number
  deltaOverAmbientK: SpreadK | null
  deltaOverAmbientUnderBoostK: { median: number, p95: number } | null
  soakEvents: SoakEvent[]
}

/** What the drive summary also shows (kept apart so the contract above stays as agreed). */
export interface DriveDetail {
  /** Which samples the spreads are over: moving ones, or every running one when the log has no road speed. */
  basis: 'moving' | 'running'
  /** Moving, not under boost. */
  cruiseDeltaK: SpreadK | null
  /** Time (over the same samples) with the charge temperature more than `overK` above ambient. */
  timeOverAmbientS: { overK: number, s: number }[]
  /** Median temperature over ambient in each third of the drive: how it changed over the drive. */
  thirds: { fromS: number, toS: number, medianK: number | null }[]
  /** Soak events need road speed. */
  hasSpeed: boolean
}

export interface DriveInput {
  channels: LogChannels
  /** Usable samples: 0 (the analysis masks). */
  flags: Uint8Array
  ambientK: Float32Array | number
  baroPa: number
  engineOffRpm: number
}

const round = (value: number, digits: number) => {
  const f = 10 ** digits
  return Math.round(value * f) / f
}

function quantile(sorted: readonly number[], q: number): number {
  // Nearest-rank on the sorted sample (common practice, no source).
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil(q * sorted.length) - 1))]!
}

function spread(values: number[]): SpreadK | null {
  if (values.length === 0) return null
  values.sort((a, b) => a - b)
  return { median: round(quantile(values, 0.5), 2), p95: round(quantile(values, 0.95), 2), max: round(values[values.length - 1]!, 2) }
}

export function driveSummary(input: DriveInput): { drive: DriveSummary, detail: DriveDetail } {
  const { channels, flags, ambientK, baroPa } = input
  const t = channels.timeS
  const n = t.length
  const charge = channels.chargeTempK
  const rpm = channels.rpm
  const speed = channels.speedMps
  const map = channels.manifoldPressurePa
  const ambientAt = (i: number) => (typeof ambientK === 'number' ? ambientK : ambientK[i]!)
  const step = (i: number) => (i + 1 < n ? Math.min(DRIVE_RULES.maxStepS, t[i + 1]! - t[i]!) : 0)
  const running = (i: number) => flags[i] === 0 && (!rpm || !(rpm[i]! < input.engineOffRpm))

  let runningS = 0
  let movingS = 0
  let boostedS = 0
  const basisValues: number[] = []
  const boostValues: number[] = []
  const cruiseValues: number[] = []
  const over = DRIVE_RULES.overAmbientLevelsK.map(overK => ({ overK, s: 0 }))
  const thirdsValues: number[][] = [[], [], []]
  const duration = n > 0 ? t[n - 1]! : 0
  for (let i = 0; i < n; i++) {
    if (!running(i)) continue
    const dt = step(i)
    runningS += dt
    const moving = speed ? speed[i]! >= DRIVE_RULES.movingMps : false
    const boosted = map ? map[i]! - baroPa >= DRIVE_RULES.boostedPa : false
    if (moving) movingS += dt
    if (boosted) boostedS += dt
    if (!charge) continue
    const delta = charge[i]! - ambientAt(i)
    if (!Number.isFinite(delta)) continue
    if (speed && !moving) continue
    basisValues.push(delta)
    if (boosted) boostValues.push(delta)
    else cruiseValues.push(delta)
    for (const level of over) if (delta > level.overK) level.s += dt
    const third = duration > 0 ? Math.min(2, Math.floor(3 * t[i]! / duration)) : 0
    thirdsValues[third]!.push(delta)
  }
  const boostSpread = spread(boostValues)
  const drive: DriveSummary = {
    runningS: round(runningS, 1),
    movingS: round(movingS, 1),
    boostedS: round(boostedS, 1),
    deltaOverAmbientK: spread(basisValues),
    deltaOverAmbientUnderBoostK: boostSpread ? { median: boostSpread.median, p95: boostSpread.p95 } : null,
    soakEvents: charge && speed ? soakEvents(t, charge, speed, flags, running) : [],
  }
  const detail: DriveDetail = {
    basis: speed ? 'moving' : 'running',
    cruiseDeltaK: spread(cruiseValues),
    timeOverAmbientS: over.map(o => ({ overK: o.overK, s: round(o.s, 1) })),
    thirds: thirdsValues.map((values, k) => {
      values.sort((a, b) => a - b)
      return { fromS: round(duration * k / 3, 1), toS: round(duration * (k + 1) / 3, 1), medianK: values.length ? round(quantile(values, 0.5), 2) : null }
    }),
    hasSpeed: Boolean(speed),
  }
  return { drive, detail }
}

/**
 * Soak events: a stretch ≥ minSlowS at < slowMps with the engine running and the samples usable,
 * during which (or just after moving off) the charge temperature climbs ≥ minRiseK above where it
 * was when the car slowed. Recovery: time from moving off until 63 % of the rise is gone.
 */
export function soakEvents(t: Float64Array, charge: Float32Array, speed: Float32Array, flags: Uint8Array, running: (i: number) => boolean): SoakEvent[] {
  const n = t.length
  const events: SoakEvent[] = []
  let i = 0
  while (i < n && events.length < 200) {
    if (!(running(i) && speed[i]! < DRIVE_RULES.slowMps && Number.isFinite(charge[i]!))) {
      i++
      continue
    }
    const start = i
    while (i < n && running(i) && speed[i]! < DRIVE_RULES.slowMps) i++
    const end = i // first sample not slow (or not usable), exclusive
    if (t[end - 1]! - t[start]! < DRIVE_RULES.minSlowS) continue
    const base = charge[start]!
    let peak = base
    let peakAt = start
    let k = start
    while (k < n && t[k]! <= t[end - 1]! + DRIVE_RULES.peakAfterS) {
      if (flags[k] === 0 && charge[k]! > peak) {
        peak = charge[k]!
        peakAt = k
      }
      k++
    }
    const rise = peak - base
    if (!(rise >= DRIVE_RULES.minRiseK)) continue
    // Recovery only counts while moving on, usable and running; the next slow stretch ends the search.
    const target = peak - DRIVE_RULES.recoveredShare * rise
    const movedOffS = t[Math.min(end, n - 1)]!
    let recoveryS: number | null = null
    if (end < n && running(end)) {
      for (let m = Math.max(end, peakAt); m < n; m++) {
        if (!running(m) || t[m]! - movedOffS > DRIVE_RULES.maxRecoveryS) break
        if (speed[m]! < DRIVE_RULES.slowMps && t[m]! - movedOffS > DRIVE_RULES.peakAfterS) break
        if (charge[m]! <= target) {
          recoveryS = round(t[m]! - movedOffS, 1)
          break
        }
      }
    }
    events.push({ startS: round(t[start]!, 1), endS: round(t[end - 1]!, 1), riseK: round(rise, 2), recoveryS })
  }
  return events
}
