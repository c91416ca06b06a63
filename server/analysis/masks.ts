// Quality masks: spans of a log that must not be read as heat soak. A stopped engine lets the
// intake sensor cook in the hot engine bay (the real diesel log shows 115–140 °C while stopped)
// and, after restart, cold air rushing past a sensor that was heat-soaked reads far below ambient
// for half a minute or so. Both are sensor artefacts, not charge-air temperatures.
import type { LogChannels } from './channels'

export const MASK_REASONS = ['engine-off', 'restart-settle', 'temp-spike', 'below-ambient'] as const
export type MaskReason = typeof MASK_REASONS[number]

/** Bit per reason in the per-sample flag array. */
export const MASK_BIT: Readonly<Record<MaskReason, number>> = {
  'engine-off': 1,
  'restart-settle': 2,
  'temp-spike': 4,
  'below-ambient': 8,
}

export interface MaskSpan {
  startS: number
  endS: number
  reason: MaskReason
  /** Plain-language explanation for the report. */
  note: string
}

// Defaults are common practice, no source, tuned so the real diesel log's stop/restart artefacts
// are covered: OBD round-robin polling updates rpm only about once a second, so the stop is seen
// late (pre-stop pad), and the undershoot after restart lasts 20–40 s there (settle window).
export interface MaskOptions {
  /** Below this the engine is taken as stopped, rpm. */
  engineOffRpm: number
  /** Also mask this long before a stop is seen, s. */
  preStopS: number
  /** Mask this long after a restart, s. */
  settleS: number
  /** A charge temperature changing faster than this is a sensor artefact, K/s. */
  maxChargeRateKPerS: number
  /** Window over which that rate is measured, s. */
  rateWindowS: number
  /** Pad added around a spike, s. */
  spikePadS: number
  /** Charge air colder than ambient by more than this is impossible after a compressor, K. */
  belowAmbientK: number
}

export const DEFAULT_MASK_OPTIONS: Readonly<MaskOptions> = {
  engineOffRpm: 300,
  preStopS: 2,
  settleS: 30,
  maxChargeRateKPerS: 10,
  rateWindowS: 1,
  spikePadS: 3,
  belowAmbientK: 3,
}

const NOTES: Record<MaskReason, string> = {
  'engine-off': 'Engine stopped (rpm near zero): the intake sensor heats up in the still engine bay; not charge-air temperature.',
  'restart-settle': 'Settling after a restart: the sensor is still recovering from the stop.',
  'temp-spike': 'Charge temperature jumped faster than air through an intercooler can change: sensor artefact.',
  'below-ambient': 'Charge air read colder than ambient, which cannot happen after a compressor: sensor still recovering.',
}

/** Defaults overridden only by values actually given (an explicit `undefined` keeps the default). */
export function withDefaults<T extends object>(defaults: Readonly<T>, given: Partial<T> | undefined): T {
  const result: T = { ...defaults } as T
  if (given) {
    for (const key of Object.keys(given) as (keyof T)[]) {
      const value = given[key]
      if (value !== undefined) result[key] = value as T[keyof T]
    }
  }
  return result
}

export interface MaskResult {
  /** Per sample: OR of MASK_BIT values; 0 = usable. */
  flags: Uint8Array
  spans: MaskSpan[]
}

/** Mark [fromS, toS] in the flag array (time is sorted, so two binary searches bound the range). */
function markRange(timeS: Float64Array, flags: Uint8Array, fromS: number, toS: number, bit: number): void {
  let i = lowerBound(timeS, fromS)
  const n = timeS.length
  while (i < n && timeS[i]! <= toS) {
    flags[i] = flags[i]! | bit
    i++
  }
}

/** First index with timeS[i] ≥ value. */
export function lowerBound(timeS: ArrayLike<number>, value: number): number {
  let lo = 0
  let hi = timeS.length
  while (lo < hi) {
    const mid = (lo + hi) >>> 1
    if (timeS[mid]! < value) lo = mid + 1
    else hi = mid
  }
  return lo
}

/**
 * Compute the masks. `ambientK` is the ambient channel, or a single value when the log has none.
 */
export function computeMasks(channels: LogChannels, ambientK: Float32Array | number | undefined, options: Partial<MaskOptions> = {}): MaskResult {
  const o = withDefaults(DEFAULT_MASK_OPTIONS, options)
  const t = channels.timeS
  const n = t.length
  const flags = new Uint8Array(n)
  const rpm = channels.rpm
  if (rpm) {
    // Runs of engine-off samples: mark them, pad before, and add the settle window after.
    let i = 0
    while (i < n) {
      if (!(rpm[i]! < o.engineOffRpm)) {
        i++
        continue
      }
      const start = i
      while (i < n && rpm[i]! < o.engineOffRpm) i++
      const startS = t[start]!
      const endS = t[i - 1]!
      markRange(t, flags, startS - o.preStopS, endS, MASK_BIT['engine-off'])
      if (i < n) markRange(t, flags, endS, t[i]! + o.settleS, MASK_BIT['restart-settle'])
    }
  }
  const charge = channels.chargeTempK
  if (charge) {
    // Rate over a window of at least rateWindowS; a two-pointer walk keeps it O(n).
    let j = 0
    for (let i = 0; i < n; i++) {
      const ti = t[i]!
      while (j < i && ti - t[j + 1]! >= o.rateWindowS) j++
      const dt = ti - t[j]!
      if (dt < o.rateWindowS) continue
      const rate = Math.abs(charge[i]! - charge[j]!) / dt
      if (rate > o.maxChargeRateKPerS) markRange(t, flags, t[j]! - o.spikePadS, ti + o.spikePadS, MASK_BIT['temp-spike'])
    }
    if (ambientK !== undefined) {
      const bit = MASK_BIT['below-ambient']
      for (let i = 0; i < n; i++) {
        const amb = typeof ambientK === 'number' ? ambientK : ambientK[i]!
        if (charge[i]! < amb - o.belowAmbientK) flags[i] = flags[i]! | bit
      }
    }
  }
  return { flags, spans: spansFromFlags(t, flags) }
}

/** The reason reported for a sample: the most basic cause first. */
function primaryReason(flag: number): MaskReason | undefined {
  for (const reason of MASK_REASONS) {
    if (flag & MASK_BIT[reason]) return reason
  }
  return undefined
}

/** Contiguous runs of the same primary reason as spans; runs less than 1 s apart are merged. */
export function spansFromFlags(timeS: Float64Array, flags: Uint8Array): MaskSpan[] {
  const spans: MaskSpan[] = []
  const n = timeS.length
  let i = 0
  while (i < n) {
    const reason = primaryReason(flags[i]!)
    if (!reason) {
      i++
      continue
    }
    const start = i
    while (i < n && primaryReason(flags[i]!) === reason) i++
    const startS = timeS[start]!
    const endS = timeS[i - 1]!
    const last = spans[spans.length - 1]
    if (last && last.reason === reason && startS - last.endS < 1) last.endS = endS
    else spans.push({ startS, endS, reason, note: NOTES[reason] })
  }
  return spans
}
