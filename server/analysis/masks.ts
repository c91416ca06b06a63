// Quality masks: spans of a log that must not be read as heat soak. A stopped engine lets the
// intake sensor cook in the hot engine bay (the real diesel log shows 115–140 °C while stopped)
// and, after restart, cold air rushing past a sensor that was heat-soaked reads far below ambient
// for half a minute or so. Both are sensor artefacts, not charge-air temperatures.
import type { LogChannels } from '../../shared/quantities/channels'

export const MASK_REASONS = ['engine-off', 'restart-settle', 'sensor-dropout', 'temp-spike', 'temp-step', 'below-ambient', 'clipped'] as const
export type MaskReason = typeof MASK_REASONS[number]

/** Bit per reason in the per-sample flag array. */
export const MASK_BIT: Readonly<Record<MaskReason, number>> = {
  'engine-off': 1,
  'restart-settle': 2,
  'temp-spike': 4,
  'below-ambient': 8,
  'sensor-dropout': 16,
  'temp-step': 32,
  // Clipped pressure or air-flow readings: the temperatures of those samples stay usable, so this
  // bit lives in its own array (`MaskResult.clipped`), never in `flags`.
  'clipped': 64,
}

export interface MaskSpan {
  startS: number
  endS: number
  reason: MaskReason
  /** Plain-language explanation for the report. */
  note: string
  /** The channel concerned, for clipped spans. */
  channel?: string
}

// Defaults are common practice, no source, tuned so the real diesel log's stop/restart artefacts
// are covered: OBD round-robin polling updates rpm only about once a second, so the stop is seen
// late (pre-stop pad), and the undershoot after restart lasts 20–40 s there (settle window).
// A temperature change is only an artefact when boost does not explain it (reference sheet §13):
// a fast sensor on a high-boost build climbs well over 10 K/s as boost arrives, which is physics.
export interface MaskOptions {
  /** Below this the engine is taken as stopped, rpm. */
  engineOffRpm: number
  /** Also mask this long before a stop is seen, s. */
  preStopS: number
  /** Mask this long after a restart, s. */
  settleS: number
  /** A charge temperature changing faster than this, with no boost change to explain it, is a step artefact, K/s. */
  maxChargeRateKPerS: number
  /** Window over which that rate is measured, s. */
  rateWindowS: number
  /** Pad added around a step, s. */
  spikePadS: number
  /** Charge air colder than ambient by more than this is impossible after a compressor, K. */
  belowAmbientK: number
  /** A single reading this far from both neighbours (which agree) is a spike, K. */
  spikeK: number
  /** A spike is one reading held at most this long (round-robin logs hold it ~1 s), s. */
  spikeMaxS: number
  /** A manifold-pressure change at least this large explains a temperature change, Pa. */
  explainBoostPa: number
  /** How far before a temperature change boost is looked at, s (turbo lag, sensor lag). */
  explainLookbackS: number
  /** A pressure or air-flow reading held at its ceiling this long is clipped, s. */
  clipMinS: number
  /** A step that steps back within this long masks the stretch in between, s. */
  stepReturnS: number
}

export const DEFAULT_MASK_OPTIONS: Readonly<MaskOptions> = {
  engineOffRpm: 300,
  preStopS: 2,
  settleS: 30,
  maxChargeRateKPerS: 10,
  rateWindowS: 1,
  spikePadS: 3,
  belowAmbientK: 3,
  spikeK: 4,
  spikeMaxS: 2,
  explainBoostPa: 15_000,
  explainLookbackS: 3,
  clipMinS: 1.5,
  stepReturnS: 120,
}

/**
 * Readings a sensor gives when it has no real value (reference sheet §13, OBD encodings; MEMORY):
 * an OBD temperature byte of 0 reads −40 °C (no sensor, open circuit); 255 reads 215 °C.
 */
export const TEMPERATURE_SENTINELS_K = [233.15, 488.15] as const
/**
 * Ceilings where a sensor pins (reference sheet §13; common practice, no source for the sensor
 * ranges): the OBD manifold-pressure byte tops out at 255 kPa, common absolute sensors at 250
 * (2.5-bar) and 300 kPa (3-bar); the OBD air-flow word at 655.35 g/s.
 */
export const PRESSURE_CEILINGS_PA = [250_000, 255_000, 300_000, 400_000] as const
export const AIR_FLOW_CEILING_KG_S = 0.65535

const NOTES: Record<MaskReason, string> = {
  'engine-off': 'Engine stopped (rpm near zero): the intake sensor heats up in the still engine bay; not charge-air temperature.',
  'restart-settle': 'Settling after a restart: the sensor is still recovering from the stop.',
  'sensor-dropout': 'The temperature sensor read its range limit (such as −40 °C): no reading, not a temperature.',
  'temp-spike': 'A single charge-temperature reading that came straight back, with no boost change to explain it: sensor artefact.',
  'temp-step': 'The charge temperature stepped faster than air through an intercooler can change, with no boost change to explain it: sensor artefact.',
  'below-ambient': 'Charge air read colder than ambient, which cannot happen after a compressor: sensor still recovering.',
  'clipped': 'The sensor sat at the end of its range: the real value was higher. Temperatures here are still used, but no density or power figure is worked out from the clipped reading; a wider-range sensor is needed.',
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
  /** Per sample: 1 where manifold pressure is clipped, 2 where air flow is (temperatures stay usable). */
  clipped: Uint8Array
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

/** Does boost explain a temperature change from index j to i (same direction, within the lookback)? */
function boostExplains(t: Float64Array, map: Float32Array | undefined, pre: Float32Array | undefined, j: number, i: number, rising: boolean, o: MaskOptions): boolean {
  if (!map && !pre) return false
  let k = j
  while (k > 0 && t[j]! - t[k - 1]! <= o.explainLookbackS) k--
  const check = (values: Float32Array | undefined, needed: number): boolean => {
    if (!values) return false
    const base = values[k]!
    let extreme = base
    for (let m = k; m <= i; m++) {
      const v = values[m]!
      if (!Number.isFinite(v)) continue
      if (rising ? v > extreme : v < extreme) extreme = v
    }
    return rising ? extreme - base >= needed : base - extreme >= needed
  }
  // A pre-cooler reading that moves the same way by more than a spike's size explains it too.
  return check(map, o.explainBoostPa) || check(pre, o.spikeK)
}

/**
 * Compute the masks. `ambientK` is the ambient channel, or a single value when the log has none.
 */
export function computeMasks(channels: LogChannels, ambientK: Float32Array | number | undefined, options: Partial<MaskOptions> = {}): MaskResult {
  const o = withDefaults(DEFAULT_MASK_OPTIONS, options)
  const t = channels.timeS
  const n = t.length
  const flags = new Uint8Array(n)
  const clipped = new Uint8Array(n)
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
  const map = channels.manifoldPressurePa
  const pre = channels.preCoolerTempK
  const charge = channels.chargeTempK
  // Sentinel readings of any temperature channel: no reading at all.
  for (const values of [charge, pre, typeof ambientK === 'number' ? undefined : ambientK]) {
    if (!values) continue
    for (let i = 0; i < n; i++) {
      const v = values[i]!
      if (TEMPERATURE_SENTINELS_K.some(s => Math.abs(v - s) < 0.05)) flags[i] = flags[i]! | MASK_BIT['sensor-dropout']
    }
  }
  if (charge) {
    markSpikes(t, charge, flags, map, pre, o)
    // Steps: a rate over a window of at least rateWindowS (two-pointer walk, O(n)) that boost does
    // not explain. Sentinel readings are left to their own mask.
    let j = 0
    const dropout = MASK_BIT['sensor-dropout'] | MASK_BIT['temp-spike']
    const steps: { atS: number, up: boolean, level: number, before: number }[] = []
    for (let i = 0; i < n; i++) {
      const ti = t[i]!
      while (j < i && ti - t[j + 1]! >= o.rateWindowS) j++
      const dt = ti - t[j]!
      if (dt < o.rateWindowS || (flags[i]! & dropout) || (flags[j]! & dropout)) continue
      const change = charge[i]! - charge[j]!
      if (!(Math.abs(change) / dt > o.maxChargeRateKPerS)) continue
      if (boostExplains(t, map, pre, j, i, change > 0, o)) continue
      markRange(t, flags, t[j]! - o.spikePadS, ti + o.spikePadS, MASK_BIT['temp-step'])
      const last = steps[steps.length - 1]
      if (!last || ti - last.atS > o.rateWindowS + o.spikePadS || last.up !== (change > 0)) steps.push({ atS: ti, up: change > 0, level: charge[i]!, before: charge[j]! })
    }
    // A step that comes back the other way: the level in between is the same fault, not air
    // (a sensor connector, a stuck reading); mask it all when the return is within stepReturnS.
    for (let k = 0; k + 1 < steps.length; k++) {
      const a = steps[k]!
      const b = steps[k + 1]!
      if (a.up !== b.up && b.atS - a.atS <= o.stepReturnS && Math.abs(b.level - a.before) < Math.abs(a.level - a.before) / 2) {
        markRange(t, flags, a.atS, b.atS, MASK_BIT['temp-step'])
      }
    }
    if (ambientK !== undefined) {
      const bit = MASK_BIT['below-ambient']
      for (let i = 0; i < n; i++) {
        const amb = typeof ambientK === 'number' ? ambientK : ambientK[i]!
        if (charge[i]! < amb - o.belowAmbientK && !(flags[i]! & MASK_BIT['sensor-dropout'])) flags[i] = flags[i]! | bit
      }
    }
  }
  const clipSpans: MaskSpan[] = []
  if (map) markClipped(t, map, clipped, 1, PRESSURE_CEILINGS_PA, 0.01, 0.02, o.clipMinS, 'manifoldPressure', clipSpans)
  if (channels.massAirFlowKgPerS) markClipped(t, channels.massAirFlowKgPerS, clipped, 2, [AIR_FLOW_CEILING_KG_S], 0.001, 0.001, o.clipMinS, 'massAirFlow', clipSpans)
  const spans = [...spansFromFlags(t, flags), ...clipSpans].sort((a, b) => a.startS - b.startS)
  return { flags, clipped, spans }
}

/**
 * Single readings that come straight back: a reading (a run of equal values, since round-robin
 * logs repeat the last value) held ≤ spikeMaxS that differs from both neighbouring readings by
 * more than spikeK in the same direction, while those neighbours agree within spikeK/2, and that
 * boost does not explain.
 */
function markSpikes(t: Float64Array, charge: Float32Array, flags: Uint8Array, map: Float32Array | undefined, pre: Float32Array | undefined, o: MaskOptions): void {
  const n = t.length
  const starts: number[] = []
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(charge[i]!)) continue
    if (starts.length === 0 || charge[i] !== charge[starts[starts.length - 1]!]) starts.push(i)
  }
  for (let k = 1; k + 1 < starts.length; k++) {
    const from = starts[k]!
    const to = starts[k + 1]! // exclusive
    const value = charge[from]!
    const before = charge[starts[k - 1]!]!
    const after = charge[to]!
    const up = value - before
    const down = value - after
    if (Math.sign(up) !== Math.sign(down) || Math.min(Math.abs(up), Math.abs(down)) <= o.spikeK) continue
    if (Math.abs(after - before) >= o.spikeK / 2) continue
    if (t[to - 1]! - t[from]! > o.spikeMaxS) continue
    if (boostExplains(t, map, pre, from, to, up > 0, o)) continue
    for (let i = from; i < to; i++) flags[i] = flags[i]! | MASK_BIT['temp-spike']
  }
}

/** Stretches where a channel sits at its highest value, that value being a known ceiling, for ≥ minS. */
function markClipped(t: Float64Array, values: Float32Array, clipped: Uint8Array, bit: number, ceilings: readonly number[], below: number, above: number, minS: number, channel: string, spans: MaskSpan[]): void {
  const n = t.length
  let max = Number.NEGATIVE_INFINITY
  for (let i = 0; i < n; i++) if (values[i]! > max) max = values[i]!
  if (!Number.isFinite(max) || !ceilings.some(c => max >= c * (1 - below) && max <= c * (1 + above))) return
  const level = max * (1 - 0.002)
  let i = 0
  while (i < n) {
    if (!(values[i]! >= level)) {
      i++
      continue
    }
    const start = i
    while (i < n && values[i]! >= level) i++
    if (t[i - 1]! - t[start]! >= minS && i - start >= 3) {
      for (let k = start; k < i; k++) clipped[k] = clipped[k]! | bit
      spans.push({ startS: t[start]!, endS: t[i - 1]!, reason: 'clipped', note: NOTES.clipped, channel })
    }
  }
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
