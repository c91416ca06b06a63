// Downsampling for charts: a 1 M-row log must draw as a few thousand points, and zooming in
// fetches the detail of the visible window. Two methods:
// - 'minmax' (default): per bucket the lowest and highest sample in time order, so a spike or a
//   masked artefact is never smoothed away (common practice for sensor plots, no source);
// - 'lttb': Largest-Triangle-Three-Buckets (S. Steinarsson, "Downsampling Time Series for Visual
//   Representation", MSc thesis, University of Iceland, 2013), visually faithful for smooth data.
// Values stay in SI (the unit is named); display units are chosen at the edge.
import { CHANNELS, channelData } from '../../shared/quantities/channels'
import type { ChannelId, LogChannels } from '../../shared/quantities/channels'
import { LogImportError } from './import/errors'
import { lowerBound } from './masks'

export type DownsampleMethod = 'minmax' | 'lttb'

export interface DownsampleOptions {
  fromS?: number
  toS?: number
  /** Most points returned per channel (default 2000, at least 10). */
  points?: number
  method?: DownsampleMethod
}

export interface Series {
  channel: ChannelId
  unit: string
  /** Time of each point, s from the start of the log. */
  t: number[]
  /** Values in `unit`; null where the log has no reading (draw a gap). */
  v: (number | null)[]
}

export interface DownsampleResult {
  fromS: number
  toS: number
  /** Samples of the log inside the window (before downsampling). */
  sampleCount: number
  method: DownsampleMethod
  series: Series[]
}

export const DEFAULT_POINTS = 2000
export const MAX_POINTS = 20000

const r3 = (value: number): number => Math.round(value * 1000) / 1000

function pushPoint(series: Series, t: number, v: number): void {
  series.t.push(r3(t))
  series.v.push(Number.isFinite(v) ? r3(v) : null)
}

function minMax(series: Series, t: Float64Array, v: ArrayLike<number>, from: number, to: number, points: number): void {
  const buckets = Math.max(1, Math.floor(points / 2))
  const size = (to - from) / buckets
  for (let b = 0; b < buckets; b++) {
    const start = from + Math.floor(b * size)
    const end = b === buckets - 1 ? to : from + Math.floor((b + 1) * size)
    if (end <= start) continue
    let lo = -1
    let hi = -1
    for (let i = start; i < end; i++) {
      const x = v[i]!
      if (!Number.isFinite(x)) continue
      if (lo < 0 || x < v[lo]!) lo = i
      if (hi < 0 || x > v[hi]!) hi = i
    }
    if (lo < 0) {
      pushPoint(series, t[start]!, Number.NaN)
    }
    else if (lo === hi) {
      pushPoint(series, t[lo]!, v[lo]!)
    }
    else {
      const first = Math.min(lo, hi)
      const second = Math.max(lo, hi)
      pushPoint(series, t[first]!, v[first]!)
      pushPoint(series, t[second]!, v[second]!)
    }
  }
}

function lttb(series: Series, t: Float64Array, v: ArrayLike<number>, from: number, to: number, points: number): void {
  const count = to - from
  const every = (count - 2) / (points - 2)
  let a = from
  pushPoint(series, t[a]!, v[a]!)
  for (let b = 0; b < points - 2; b++) {
    // Average of the next bucket is the third corner of the triangle.
    const nextStart = from + Math.floor((b + 1) * every) + 1
    const nextEnd = Math.min(to, from + Math.floor((b + 2) * every) + 1)
    let avgT = 0
    let avgV = 0
    let m = 0
    for (let i = nextStart; i < nextEnd; i++) {
      if (!Number.isFinite(v[i]!)) continue
      avgT += t[i]!
      avgV += v[i]!
      m++
    }
    if (m > 0) {
      avgT /= m
      avgV /= m
    }
    else {
      avgT = t[Math.min(to - 1, nextStart)]!
      avgV = v[a]!
    }
    const start = from + Math.floor(b * every) + 1
    const end = from + Math.floor((b + 1) * every) + 1
    let best = -1
    let bestArea = -1
    const at = t[a]!
    const av = v[a]!
    for (let i = start; i < end; i++) {
      const x = v[i]!
      if (!Number.isFinite(x)) continue
      const area = Math.abs((at - avgT) * (x - av) - (at - t[i]!) * (avgV - av))
      if (area > bestArea) {
        bestArea = area
        best = i
      }
    }
    if (best < 0) {
      pushPoint(series, t[start]!, Number.NaN)
      continue
    }
    pushPoint(series, t[best]!, v[best]!)
    a = best
  }
  pushPoint(series, t[to - 1]!, v[to - 1]!)
}

/** Downsample the named channels over [fromS, toS] to at most `points` points each. */
export function downsample(channels: LogChannels, names: readonly ChannelId[], options: DownsampleOptions = {}): DownsampleResult {
  const t = channels.timeS
  const n = t.length
  const endS = n > 0 ? t[n - 1]! : 0
  const fromS = Math.max(0, options.fromS ?? 0)
  const toS = Math.min(endS, options.toS ?? endS)
  const points = Math.round(options.points ?? DEFAULT_POINTS)
  const method = options.method ?? 'minmax'
  if (!Number.isFinite(fromS) || !Number.isFinite(toS) || toS < fromS) {
    throw new LogImportError('BAD_OPTION', `The series window ${String(options.fromS)}–${String(options.toS)} s is not valid: "from" must be before "to", within 0–${endS.toFixed(1)} s.`)
  }
  if (!Number.isFinite(points) || points < 10 || points > MAX_POINTS) {
    throw new LogImportError('BAD_OPTION', `points must be between 10 and ${MAX_POINTS}; got ${String(options.points)}.`)
  }
  const from = lowerBound(t, fromS)
  const to = lowerBound(t, toS + 1e-9)
  const series: Series[] = []
  for (const name of names) {
    const data = channelData(channels, name)
    if (!data) continue
    const out: Series = { channel: name, unit: name === 'time' ? 's' : CHANNELS[name].siUnit, t: [], v: [] }
    const count = to - from
    if (count <= points) {
      for (let i = from; i < to; i++) pushPoint(out, t[i]!, data[i]!)
    }
    else if (method === 'lttb') {
      lttb(out, t, data, from, to, points)
    }
    else {
      minMax(out, t, data, from, to, points)
    }
    series.push(out)
  }
  return { fromS, toS, sampleCount: to - from, method, series }
}
