// One file, several drives: the parser marks where time runs backwards or jumps (see
// `DRIVE_BREAK` in parse.ts); here those breaks become drives the user can pick from, and one
// drive is cut out of the joined arrays with its own time starting at zero.
import { CHANNELS, VALUE_CHANNEL_IDS } from '../../../shared/quantities/channels'
import type { LogChannels } from '../../../shared/quantities/channels'
import { KELVIN_OFFSET } from '../constants'
import { fromSI } from '../../../shared/quantities/units'
import type { DriveBreak } from './parse'

/** Drives shorter than this are fragments (a stray row, a logger hiccup), not drives (common practice, no source). */
export const MIN_DRIVE_ROWS = 10

export interface DriveInfo {
  /** 0-based position among the drives of the file (what a drive choice names). */
  index: number
  /** Time of the drive's first row as the file writes it, s (a time of day: s after midnight). */
  startS: number
  durationS: number
  rows: number
  /** First line of the drive in the file (1-based, header = line 1). */
  line: number
  /** Why the drive starts where it does. */
  cause: DriveBreak['cause']
  /** What the drive contains, in plain words (for the upload page). */
  contains: string
}

export interface DriveRange extends DriveInfo {
  fromRow: number
  toRow: number
}

/** Drives from the parser's breaks; fragments below `MIN_DRIVE_ROWS` rows are dropped and counted. */
export function drivesFromBreaks(timeS: Float64Array, rowCount: number, allBreaks: readonly DriveBreak[], channels: LogChannels): { drives: DriveRange[], droppedRows: number } {
  const drives: DriveRange[] = []
  let droppedRows = 0
  // A file where no part is long enough to be a drive is not split at all (a short test file with a pause).
  const sizes = allBreaks.map((b, k) => (k + 1 < allBreaks.length ? allBreaks[k + 1]!.row : rowCount) - b.row)
  const breaks = sizes.some(size => size >= MIN_DRIVE_ROWS) ? allBreaks : allBreaks.slice(0, 1)
  for (let k = 0; k < breaks.length; k++) {
    const fromRow = breaks[k]!.row
    const toRow = k + 1 < breaks.length ? breaks[k + 1]!.row : rowCount
    const rows = toRow - fromRow
    if (rows <= 0) continue
    if (rows < MIN_DRIVE_ROWS && breaks.length > 1) {
      droppedRows += rows
      continue
    }
    drives.push({
      index: drives.length,
      startS: breaks[k]!.rawTimeS,
      durationS: timeS[toRow - 1]! - timeS[fromRow]!,
      rows,
      line: breaks[k]!.line,
      cause: breaks[k]!.cause,
      contains: describeDrive(channels, fromRow, toRow),
      fromRow,
      toRow,
    })
  }
  return { drives, droppedRows }
}

/** The public part of a drive (no row positions). */
export function driveInfo(drive: DriveRange): DriveInfo {
  const { fromRow: _from, toRow: _to, ...info } = drive
  return info
}

function rangeMinMax(values: Float32Array | undefined, from: number, to: number): [number, number] {
  let min = Number.POSITIVE_INFINITY
  let max = Number.NEGATIVE_INFINITY
  if (values) {
    for (let i = from; i < to; i++) {
      const v = values[i]!
      if (!Number.isFinite(v)) continue
      if (v < min) min = v
      if (v > max) max = v
    }
  }
  return [min, max]
}

/** "up to 125 km/h; manifold pressure up to 221 kPa; charge temperature 3–14 °C; engine speed to 3 900 rpm". */
export function describeDrive(channels: LogChannels, from: number, to: number): string {
  const parts: string[] = []
  const [, speed] = rangeMinMax(channels.speedMps, from, to)
  if (Number.isFinite(speed)) parts.push(speed < 1 ? 'standing still' : `road speed up to ${Math.round(fromSI(speed, 'km/h'))} km/h`)
  const [, map] = rangeMinMax(channels.manifoldPressurePa, from, to)
  if (Number.isFinite(map)) parts.push(`boost up to ${Math.round(map / 1000)} kPa abs`)
  const [cMin, cMax] = rangeMinMax(channels.chargeTempK, from, to)
  if (Number.isFinite(cMin)) parts.push(`charge temperature ${Math.round(cMin - KELVIN_OFFSET)} to ${Math.round(cMax - KELVIN_OFFSET)} °C`)
  const [, rpm] = rangeMinMax(channels.rpm, from, to)
  if (Number.isFinite(rpm)) parts.push(rpm < 300 ? 'engine not running' : `engine speed up to ${Math.round(rpm)} rpm`)
  return parts.length ? parts.join('; ') : 'no readings'
}

/** One drive's channels with its own time axis starting at 0 (copies; the joined arrays stay as they are). */
export function sliceDrive(channels: LogChannels, fromRow: number, toRow: number): LogChannels {
  const t0 = channels.timeS[fromRow] ?? 0
  const timeS = channels.timeS.slice(fromRow, toRow)
  for (let i = 0; i < timeS.length; i++) timeS[i] = timeS[i]! - t0
  const out: LogChannels = { timeS }
  for (const id of VALUE_CHANNEL_IDS) {
    const field = CHANNELS[id].field
    const values = channels[field]
    if (values) out[field] = values.slice(fromRow, toRow)
  }
  return out
}
