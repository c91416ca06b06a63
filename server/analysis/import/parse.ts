// Streaming, columnar parse of a log into typed arrays, one per mapped channel.
//
// Two readers feed the same `ColumnSink`:
// - a byte-level fast path for the common case (no quote characters): it walks each chunk once,
//   reads numbers straight from the bytes and only decodes a cell to text when it is not a plain
//   number (glued units, junk); nothing is allocated per row;
// - papaparse (streamed) for files with quoted fields, and for UTF-16 text.
// The unit tests run both on the same inputs and require identical arrays.
import { Buffer } from 'node:buffer'
import { createReadStream } from 'node:fs'
import { Transform } from 'node:stream'
import Papa from 'papaparse'
import { CHANNELS } from '../../../shared/quantities/channels'
import type { TimeFormat, ValueChannelId } from '../../../shared/quantities/channels'
import { conversionFor, quantityOf } from '../../../shared/quantities/units'
import type { Unit } from '../../../shared/quantities/units'
import type { DetectedFormat, SourceEncoding } from './detect'
import { readNumberCell, readTimeCell } from './detect'
import { LogImportError } from './errors'

export interface SlotPlan {
  channel: ValueChannelId
  columnIndex: number
  header: string
  unit: Unit
}

export interface ParsePlan {
  format: DetectedFormat
  columnCount: number
  timeColumnIndex: number
  timeHeader: string
  timeFormat: TimeFormat | 'datetime'
  slots: SlotPlan[]
  /** A held value older than this (s) becomes missing instead (sparse round-robin logs). */
  staleLimitS: number
  maxRows: number
  /** Rows expected (sizing hint for the typed arrays; they grow if it is short). */
  expectedRows: number
}

export interface SlotStats {
  /** Cells left empty in the file. */
  empty: number
  /** Cells that held something other than a number. */
  junk: number
  /** Numbers outside the channel's plausible range (treated as missing). */
  outOfRange: number
  /** Samples filled by holding the last value. */
  held: number
  /** Samples still missing after holding. */
  missing: number
  firstJunkLine: number
  firstJunkText: string
}

export interface ParseResult {
  rowCount: number
  timeS: Float64Array
  values: Float32Array[]
  stats: SlotStats[]
  skippedRows: number
  firstSkippedLine: number
  firstSkippedText: string
  backwardsRows: number
  firstBackwardsLine: number
  midnightWraps: number
  /** Time of day (s since midnight) of the first sample, for clock-formatted logs. */
  firstClockS: number
  /** Where each drive of the file starts (see `DRIVE_BREAK`): the first one always at row 0. */
  driveBreaks: DriveBreak[]
}

/** The first row of one drive of a file. */
export interface DriveBreak {
  /** Row (sample) index in the parsed arrays. */
  row: number
  /** 1-based line of the file. */
  line: number
  /** Time as the file writes it (s; for a time of day, s after midnight). */
  rawTimeS: number
  /** Why a new drive starts here. */
  cause: 'start' | 'backwards' | 'jump'
}

/**
 * When a file holds several drives (common practice, no source): time going back by more than
 * `backwardsS` (a logger restarted its clock, or two files were joined), or jumping forward by more
 * than `jumpS` between two rows (the logger was off in between). A smaller step back is one
 * misplaced row, dropped with a warning as before.
 */
export const DRIVE_BREAK = { backwardsS: 10, jumpS: 300 } as const
/** Gap placed after a drive when the next one's time starts earlier (keeps the joined time axis rising). */
const DRIVE_GAP_S = 1

class NeedsRobustPath extends Error {}

// Exact powers of ten for the fast decimal read: mantissa/10^k is correctly rounded when the
// mantissa has at most 15 digits and k ≤ 22 (Clinger 1990, "How to read floating point numbers
// accurately"), so it equals what Number()/parseFloat return.
const POW10 = Array.from({ length: 23 }, (_, k) => 10 ** k)
const HALF_DAY_S = 43200
const DAY_S = 86400

/** Collects one row at a time and writes the converted samples into growing typed arrays. */
export class ColumnSink {
  readonly plan: ParsePlan
  private readonly slotCount: number
  private readonly scale: Float64Array
  private readonly offset: Float64Array
  private readonly min: Float64Array
  private readonly max: Float64Array
  private readonly last: Float64Array
  private readonly lastT: Float64Array
  /** Raw values of the current row, in the column's own unit (NaN = empty). */
  readonly row: Float64Array
  /** 0 = empty, 1 = number, 2 = junk, per slot for the current row. */
  readonly rowState: Uint8Array
  rowTime = Number.NaN
  rowTimeText = ''
  private capacity: number
  private times: Float64Array
  private columns: Float32Array[]
  readonly stats: SlotStats[]
  count = 0
  private t0 = Number.NaN
  private previousRaw = Number.NaN
  private previousS = Number.NEGATIVE_INFINITY
  private dayOffset = 0
  skippedRows = 0
  firstSkippedLine = 0
  firstSkippedText = ''
  backwardsRows = 0
  firstBackwardsLine = 0
  midnightWraps = 0
  private firstRaw = Number.NaN
  readonly driveBreaks: DriveBreak[] = []

  constructor(plan: ParsePlan) {
    this.plan = plan
    const n = plan.slots.length
    this.slotCount = n
    this.scale = new Float64Array(n)
    this.offset = new Float64Array(n)
    this.min = new Float64Array(n)
    this.max = new Float64Array(n)
    this.last = new Float64Array(n).fill(Number.NaN)
    this.lastT = new Float64Array(n).fill(Number.NEGATIVE_INFINITY)
    this.row = new Float64Array(n).fill(Number.NaN)
    this.rowState = new Uint8Array(n)
    plan.slots.forEach((slot, i) => {
      const { scale, offset } = conversionFor(slot.unit)
      this.scale[i] = scale
      this.offset[i] = offset
      this.min[i] = CHANNELS[slot.channel].plausibleMin
      this.max[i] = CHANNELS[slot.channel].plausibleMax
    })
    this.capacity = Math.max(16, Math.min(plan.expectedRows, plan.maxRows + 1))
    this.times = new Float64Array(this.capacity)
    this.columns = plan.slots.map(() => new Float32Array(this.capacity))
    this.stats = plan.slots.map(() => ({ empty: 0, junk: 0, outOfRange: 0, held: 0, missing: 0, firstJunkLine: 0, firstJunkText: '' }))
  }

  beginRow(): void {
    this.row.fill(Number.NaN)
    this.rowState.fill(0)
    this.rowTime = Number.NaN
    this.rowTimeText = ''
  }

  setValue(slot: number, value: number): void {
    this.row[slot] = value
    this.rowState[slot] = 1
  }

  /** A cell that is not a plain number: read it as text (glued unit, junk, empty). */
  setText(slot: number, text: string, line: number): void {
    const reading = readNumberCell(text, this.plan.format.decimalComma)
    if (Number.isNaN(reading.value)) {
      if (text.trim() === '') return
      this.rowState[slot] = 2
      const stats = this.stats[slot]!
      stats.junk++
      if (stats.firstJunkLine === 0) {
        stats.firstJunkLine = line
        stats.firstJunkText = text.trim().slice(0, 40)
      }
      return
    }
    let value = reading.value
    const own = this.plan.slots[slot]!.unit
    if (reading.unit && reading.unit !== own) {
      // A value that names its own unit (`14.7psi` in a kPa column) is converted to the column's unit.
      try {
        const from = conversionFor(reading.unit)
        const to = conversionFor(own)
        value = (value * from.scale + from.offset - to.offset) / to.scale
        if (CHANNELS[this.plan.slots[slot]!.channel].quantity !== quantityOf(reading.unit)) value = Number.NaN
      }
      catch {
        value = Number.NaN
      }
    }
    this.setValue(slot, value)
  }

  setTimeText(text: string): void {
    this.rowTime = readTimeCell(text, this.plan.timeFormat, this.plan.format.decimalComma)
    this.rowTimeText = text
  }

  endRow(line: number): void {
    let raw = this.rowTime
    if (Number.isNaN(raw)) {
      // A row whose time cannot be read cannot be placed; a completely empty row is just skipped.
      let any = this.rowTimeText.trim() !== ''
      for (let s = 0; s < this.slotCount && !any; s++) any = this.rowState[s] !== 0
      if (any) {
        this.skippedRows++
        if (this.firstSkippedLine === 0) {
          this.firstSkippedLine = line
          this.firstSkippedText = this.rowTimeText.trim().slice(0, 40)
        }
      }
      return
    }
    if (this.plan.timeFormat === 'clock' && raw + HALF_DAY_S < this.previousRaw) {
      // Time of day went back by more than half a day: the log ran past midnight.
      this.dayOffset += DAY_S
      this.midnightWraps++
    }
    this.previousRaw = raw
    raw += this.dayOffset
    if (Number.isNaN(this.t0)) {
      this.t0 = raw
      this.firstRaw = raw
      this.driveBreaks.push({ row: 0, line, rawTimeS: raw, cause: 'start' })
    }
    let t = raw - this.t0
    const back = this.previousS - t
    const jump = t - this.previousS
    if (this.count > 0 && (back > DRIVE_BREAK.backwardsS || jump > DRIVE_BREAK.jumpS)) {
      // A new drive: its time continues the joined axis just after the last one, and values held
      // from the drive before are not carried over.
      this.driveBreaks.push({ row: this.count, line, rawTimeS: raw, cause: back > 0 ? 'backwards' : 'jump' })
      if (back > 0) {
        this.t0 = raw - (this.previousS + DRIVE_GAP_S)
        t = raw - this.t0
      }
      this.lastT.fill(Number.NEGATIVE_INFINITY)
    }
    else if (t < this.previousS) {
      // One out-of-order row would break every windowed computation downstream; drop and report it.
      this.backwardsRows++
      if (this.firstBackwardsLine === 0) this.firstBackwardsLine = line
      return
    }
    this.previousS = t
    const n = this.count
    if (n >= this.capacity) this.grow(n + 1)
    this.times[n] = t
    const stale = this.plan.staleLimitS
    for (let s = 0; s < this.slotCount; s++) {
      let v = this.row[s]!
      const state = this.rowState[s]!
      if (state === 1) {
        v = v * this.scale[s]! + this.offset[s]!
        if (!(v >= this.min[s]! && v <= this.max[s]!)) {
          this.stats[s]!.outOfRange++
          v = Number.NaN
        }
      }
      else if (state === 0) {
        this.stats[s]!.empty++
      }
      if (Number.isNaN(v)) {
        if (t - this.lastT[s]! <= stale) {
          v = this.last[s]!
          this.stats[s]!.held++
        }
        else {
          this.stats[s]!.missing++
        }
      }
      else {
        this.last[s] = v
        this.lastT[s] = t
      }
      this.columns[s]![n] = v
    }
    this.count = n + 1
    if (this.count > this.plan.maxRows) {
      throw new LogImportError('TOO_MANY_ROWS',
        `The log has more than ${this.plan.maxRows.toLocaleString('en')} rows (limit reached at line ${line}). Split it into shorter logs or log at a lower rate, then upload each part.`, { line })
    }
  }

  private grow(needed: number): void {
    const next = Math.max(needed, Math.ceil(this.capacity * 1.5))
    const times = new Float64Array(next)
    times.set(this.times)
    this.times = times
    this.columns = this.columns.map((column) => {
      const grown = new Float32Array(next)
      grown.set(column)
      return grown
    })
    this.capacity = next
  }

  finish(): ParseResult {
    const n = this.count
    // A generous size estimate is trimmed by copying only when it wasted more than a quarter.
    const fit = <T extends Float64Array | Float32Array>(array: T): T => (array.length > n * 1.25 + 16 ? array.slice(0, n) : array.subarray(0, n)) as T
    return {
      rowCount: n,
      timeS: fit(this.times),
      values: this.columns.map(fit),
      stats: this.stats,
      skippedRows: this.skippedRows,
      firstSkippedLine: this.firstSkippedLine,
      firstSkippedText: this.firstSkippedText,
      backwardsRows: this.backwardsRows,
      firstBackwardsLine: this.firstBackwardsLine,
      midnightWraps: this.midnightWraps,
      firstClockS: this.plan.timeFormat === 'clock' || this.plan.timeFormat === 'hms' ? this.firstRaw : Number.NaN,
      driveBreaks: this.driveBreaks.length ? this.driveBreaks : [{ row: 0, line: 0, rawTimeS: 0, cause: 'start' }],
    }
  }
}

const TIME_TARGET = -2
const SKIP_TARGET = -1

/**
 * Byte-level reader for delimited numeric text. Feed it chunks in order; it keeps the partial
 * last line between chunks. Throws `NeedsRobustPath` when it meets a quote character, because a
 * quoted field may hide delimiters or line breaks that only a full CSV parser handles.
 */
export class FastCsvReader {
  private readonly sink: ColumnSink
  private readonly targets: Int32Array
  private readonly delimiter: number
  private readonly decimal: number
  private readonly newline: number
  private readonly skipLines: number
  private readonly clockTime: boolean
  private readonly msTime: boolean
  private readonly textTime: boolean
  private leftover: Buffer | undefined
  line = 0

  constructor(sink: ColumnSink) {
    const plan = sink.plan
    this.sink = sink
    this.targets = new Int32Array(plan.columnCount + 2).fill(SKIP_TARGET)
    this.targets[plan.timeColumnIndex] = TIME_TARGET
    plan.slots.forEach((slot, i) => {
      this.targets[slot.columnIndex] = i
    })
    this.delimiter = plan.format.delimiter.charCodeAt(0)
    this.decimal = plan.format.decimalComma ? 44 : 46
    this.newline = plan.format.lineEnding === 'cr' ? 13 : 10
    this.skipLines = plan.format.headerLineIndex + 1
    this.clockTime = plan.timeFormat === 'clock' || plan.timeFormat === 'hms'
    this.msTime = plan.timeFormat === 'ms'
    this.textTime = plan.timeFormat === 'datetime'
  }

  feed(chunk: Uint8Array, final: boolean): void {
    let data = Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk.buffer, chunk.byteOffset, chunk.byteLength)
    if (this.leftover) {
      // Complete the carried-over partial line with the head of this chunk only, so a chunk is
      // never copied whole.
      const firstNewline = data.indexOf(this.newline)
      if (firstNewline < 0 && !final) {
        this.leftover = Buffer.concat([this.leftover, data])
        return
      }
      const headEnd = firstNewline < 0 ? data.length : firstNewline + 1
      const joined = Buffer.concat([this.leftover, data.subarray(0, headEnd)])
      this.leftover = undefined
      this.lines(joined, joined.length)
      data = data.subarray(headEnd)
    }
    let limit = data.length
    if (!final) {
      const lastNewline = data.lastIndexOf(this.newline)
      if (lastNewline < 0) {
        this.leftover = Buffer.from(data)
        return
      }
      limit = lastNewline + 1
      if (limit < data.length) this.leftover = Buffer.from(data.subarray(limit))
    }
    this.lines(data, limit)
  }

  private lines(data: Buffer, limit: number): void {
    let pos = 0
    while (pos < limit) {
      let eol = data.indexOf(this.newline, pos)
      if (eol < 0 || eol >= limit) eol = limit
      let end = eol
      if (end > pos && data[end - 1] === 13) end--
      this.line++
      if (this.line > this.skipLines && end > pos) this.row(data, pos, end)
      pos = eol + 1
    }
  }

  private row(data: Buffer, start: number, end: number): void {
    const sink = this.sink
    const targets = this.targets
    const targetCount = targets.length
    const delimiter = this.delimiter
    const decimal = this.decimal
    sink.beginRow()
    let field = 0
    let p = start
    for (;;) {
      const target = field < targetCount ? targets[field]! : SKIP_TARGET
      if (target === SKIP_TARGET) {
        while (p < end) {
          const c = data[p]!
          if (c === delimiter) break
          if (c === 34) throw new NeedsRobustPath()
          p++
        }
      }
      else if (target === TIME_TARGET && (this.clockTime || this.textTime)) {
        p = this.readClock(data, p, end)
      }
      else {
        let q = p
        while (q < end && data[q] === 32) q++
        let negative = false
        if (q < end) {
          const sign = data[q]!
          if (sign === 45) {
            negative = true
            q++
          }
          else if (sign === 43) {
            q++
          }
          else if (sign === 34) {
            throw new NeedsRobustPath()
          }
        }
        let mantissa = 0
        let digits = 0
        let fraction = 0
        let dot = false
        while (q < end) {
          const c = data[q]!
          if (c >= 48 && c <= 57) {
            mantissa = mantissa * 10 + (c - 48)
            digits++
            if (dot) fraction++
          }
          else if (c === decimal && !dot) {
            dot = true
          }
          else {
            break
          }
          q++
        }
        while (q < end && data[q] === 32) q++
        if ((q < end && data[q] !== delimiter) || digits > 15 || fraction > 22 || (digits === 0 && q > p && !isBlank(data, p, q))) {
          // Not a plain number: find the end of the cell and read it as text.
          let e = q
          while (e < end && data[e] !== delimiter) {
            if (data[e] === 34) throw new NeedsRobustPath()
            e++
          }
          const text = data.toString('utf8', p, e)
          if (target === TIME_TARGET) sink.setTimeText(text)
          else sink.setText(target, text, this.line)
          p = e
        }
        else if (digits > 0) {
          let value = fraction === 0 ? mantissa : mantissa / POW10[fraction]!
          if (negative) value = -value
          if (target === TIME_TARGET) {
            sink.rowTime = this.msTime ? value / 1000 : value
            sink.rowTimeText = 'x'
          }
          else {
            sink.setValue(target, value)
          }
          p = q
        }
        else {
          p = q
        }
      }
      field++
      if (p >= end) break
      p++
    }
    sink.endRow(this.line)
  }

  /** `H:MM:SS(.fff)` straight from the bytes; anything else (dates) goes through text. */
  private readClock(data: Buffer, start: number, end: number): number {
    const sink = this.sink
    let p = start
    while (p < end && data[p] === 32) p++
    let total = 0
    let part = 0
    let colons = 0
    let digits = 0
    let fraction = 0
    let fractionDigits = 0
    let dot = false
    let plain = !this.textTime
    while (p < end) {
      const c = data[p]!
      if (c === this.delimiter) break
      if (c >= 48 && c <= 57) {
        if (dot) {
          if (fractionDigits < 15) {
            fraction = fraction * 10 + (c - 48)
            fractionDigits++
          }
        }
        else {
          part = part * 10 + (c - 48)
          digits++
        }
      }
      else if (c === 58 && !dot) {
        total = total * 60 + part
        part = 0
        colons++
      }
      else if ((c === 46 || c === 44) && !dot && colons === 2) {
        dot = true
      }
      else if (c === 34) {
        throw new NeedsRobustPath()
      }
      else if (c !== 32) {
        plain = false
      }
      p++
    }
    if (plain && colons === 2 && digits > 0) {
      // Seconds as one correctly rounded decimal, like Number('57.475') in the text path.
      const seconds = fractionDigits > 0 ? (part * POW10[fractionDigits]! + fraction) / POW10[fractionDigits]! : part
      sink.rowTime = total * 60 + seconds
      sink.rowTimeText = 'x'
    }
    else {
      sink.setTimeText(data.toString('utf8', start, p))
    }
    return p
  }
}

function isBlank(data: Buffer, from: number, to: number): boolean {
  for (let i = from; i < to; i++) if (data[i] !== 32) return false
  return true
}

/** One row of cells from papaparse into the sink. */
function robustRow(sink: ColumnSink, cells: readonly string[], line: number): void {
  const plan = sink.plan
  sink.beginRow()
  const time = cells[plan.timeColumnIndex]
  if (time !== undefined) sink.setTimeText(time)
  plan.slots.forEach((slot, i) => {
    const cell = cells[slot.columnIndex]
    if (cell !== undefined) sink.setText(i, cell, line)
  })
  sink.endRow(line)
}

/** Rows papaparse reports before the first data row (blank lines are skipped by it). */
function robustSkipRows(format: DetectedFormat, text: string): number {
  const lines = text.split(/\r\n|\n|\r/, format.headerLineIndex + 1)
  return lines.filter(line => line.trim() !== '').length
}

function parseTextRobust(sink: ColumnSink, text: string): void {
  const skip = robustSkipRows(sink.plan.format, text)
  let index = 0
  Papa.parse<string[]>(text, {
    delimiter: sink.plan.format.delimiter,
    skipEmptyLines: true,
    step: (results) => {
      index++
      if (index > skip) robustRow(sink, results.data, index)
    },
  })
}

// The file is read in 1 MB chunks, each decoded with the sample's decoder (a character split
// between chunks waits for the next), and fed to papaparse as a stream of text, so no encoding
// holds the whole file in memory. (Papaparse's duplex stream mode never ended here once a file
// filled more than one read; its plain readable-stream input does.)
async function parseFileRobust(sink: ColumnSink, path: string, encoding: SourceEncoding, head: string): Promise<void> {
  const skip = robustSkipRows(sink.plan.format, head)
  const bytes = createReadStream(path, { highWaterMark: 1 << 20 })
  const decoder = new TextDecoder(encoding)
  const text = new Transform({
    readableObjectMode: true,
    transform(chunk: Buffer, _encoding, callback) {
      const decoded = decoder.decode(chunk, { stream: true })
      callback(null, decoded || undefined)
    },
    flush(callback) {
      callback(null, decoder.decode() || undefined)
    },
  })
  await new Promise<void>((resolve, reject) => {
    let index = 0
    let failed = false
    const fail = (error: unknown) => {
      if (failed) return
      failed = true
      bytes.destroy()
      reject(error)
    }
    bytes.on('error', fail)
    Papa.parse<string[]>(bytes.pipe(text) as unknown as File, {
      delimiter: sink.plan.format.delimiter,
      skipEmptyLines: true,
      step: (results, parser) => {
        if (failed) return
        index++
        if (index <= skip) return
        try {
          robustRow(sink, results.data, index)
        }
        catch (error) {
          parser.abort()
          fail(error)
        }
      },
      complete: () => {
        if (!failed) resolve()
      },
      error: fail,
    })
  })
}

/** Bytes of a log held in memory or in a file. */
export type ParseSource = { kind: 'bytes', bytes: Uint8Array } | { kind: 'file', path: string }

/**
 * Parse the whole source with the plan. `head` is the decoded start of the source (used to count
 * preamble rows for papaparse).
 */
export async function parseSource(source: ParseSource, plan: ParsePlan, head: string): Promise<ParseResult> {
  // The byte-level reader reads UTF-8 only; other encodings (rare) take the papaparse path.
  if (!plan.format.quoted && plan.format.encoding === 'utf-8') {
    const sink = new ColumnSink(plan)
    const reader = new FastCsvReader(sink)
    try {
      if (source.kind === 'bytes') {
        reader.feed(source.bytes, true)
      }
      else {
        const stream = createReadStream(source.path, { highWaterMark: 1 << 20 })
        for await (const chunk of stream as AsyncIterable<Buffer>) reader.feed(chunk, false)
        reader.feed(new Uint8Array(0), true)
      }
      return sink.finish()
    }
    catch (error) {
      if (!(error instanceof NeedsRobustPath)) throw error
      // A quote appeared after the sample: start again with the full CSV parser.
    }
  }
  const sink = new ColumnSink(plan)
  if (source.kind === 'bytes') {
    const text = new TextDecoder(plan.format.encoding).decode(source.bytes)
    parseTextRobust(sink, text)
  }
  else {
    await parseFileRobust(sink, source.path, plan.format.encoding, head)
  }
  return sink.finish()
}

/** Run only the byte-level reader (tests compare it with papaparse on the same bytes). */
export function parseBytesFast(bytes: Uint8Array, plan: ParsePlan): ParseResult {
  const sink = new ColumnSink(plan)
  new FastCsvReader(sink).feed(bytes, true)
  return sink.finish()
}

/** Run only the papaparse reader on decoded text. */
export function parseTextWithPapa(text: string, plan: ParsePlan): ParseResult {
  const sink = new ColumnSink(plan)
  parseTextRobust(sink, text)
  return sink.finish()
}
