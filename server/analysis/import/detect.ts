// Format detection on a sample from the start of a log: encoding, delimiter, decimal separator,
// header line, units in header names, units glued to values and the time format. Pure string
// work (no Node APIs) so the same rules can run wherever the sample is read.
import Papa from 'papaparse'
import { parseUnit } from '../../../shared/quantities/units'
import type { Unit } from '../../../shared/quantities/units'
import type { TimeFormat } from '../../../shared/quantities/channels'
import { LogImportError } from './errors'

export type Delimiter = ',' | ';' | '\t'
export type LineEnding = 'lf' | 'crlf' | 'cr'
export type SourceEncoding = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252'

export interface DetectedFormat {
  encoding: SourceEncoding
  bom: boolean
  delimiter: Delimiter
  decimalComma: boolean
  lineEnding: LineEnding
  /** 0-based index among the file's lines (blank and `#` lines before it included). */
  headerLineIndex: number
  /** Every data row carries one more (empty) field than the header names. */
  trailingDelimiter: boolean
  /** The sample contains quote characters: the robust (papaparse) path parses the file. */
  quoted: boolean
  /** Header text had UTF-8 read as Latin-1 (`Â°C`) and was repaired. */
  repairedEncoding: boolean
}

export type ColumnKind = 'numeric' | 'numeric-with-unit' | 'clock' | 'datetime' | 'empty' | 'text'

export interface ColumnInfo {
  index: number
  /** Header cell as written (after encoding repair). */
  header: string
  /** Header without the unit part, trimmed. */
  name: string
  /** Unit text found in brackets/parentheses of the header ('' for empty `()`), or undefined. */
  unitText?: string
  /** Canonical unit from the header, or from the suffix glued to values (`36C`). */
  unit?: Unit
  /** Unit taken from values like `61kPa` rather than from the header. */
  unitFromValues?: boolean
  kind: ColumnKind
  /** First non-empty cells, as written. */
  samples: string[]
  /** Share of non-empty sample cells that read as numbers (0–1). */
  numericShare: number
  /** Share of sample rows with an empty cell (0–1); high on sparse round-robin logs. */
  emptyShare: number
  /** Number of sample cells that read as numbers (or times). */
  numericCount: number
  /** Median of the numeric sample values, in the column's own unit (NaN if none). */
  median: number
  min: number
  max: number
  /** For a time column: median positive step between samples, in the column's own unit. */
  medianStep: number
}

export interface SampleAnalysis {
  format: DetectedFormat
  columns: ColumnInfo[]
  /** Data rows of the sample split into cells (for previews). */
  rows: string[][]
  /** The sample ended before the end of the source, so `rows` is a prefix. */
  truncated: boolean
  /** Mean length of the sampled data lines in characters, terminator included (sizes the arrays). */
  charsPerRow: number
}

/** How many bytes of the source are looked at for detection. */
export const SAMPLE_BYTES = 256 * 1024
const SAMPLE_ROWS = 2000

const UTF8_BOM = [0xEF, 0xBB, 0xBF]

/**
 * Which text encoding the bytes use, judged by a byte-order mark, by NUL bytes (UTF-16 without a
 * mark), or else by whether they are valid UTF-8: bytes that are not (a lone 0xB0 for `°`) come
 * from an older Windows program and are read as Windows-1252, of which Latin-1 is a part.
 */
export function detectEncoding(bytes: Uint8Array): { encoding: SourceEncoding, bom: boolean } {
  if (bytes[0] === UTF8_BOM[0] && bytes[1] === UTF8_BOM[1] && bytes[2] === UTF8_BOM[2]) return { encoding: 'utf-8', bom: true }
  if (bytes[0] === 0xFF && bytes[1] === 0xFE) return { encoding: 'utf-16le', bom: true }
  if (bytes[0] === 0xFE && bytes[1] === 0xFF) return { encoding: 'utf-16be', bom: true }
  // Without a BOM, UTF-16 text of ASCII digits has a NUL in every other byte.
  let evenNul = 0
  let oddNul = 0
  const n = Math.min(bytes.length, 4096)
  for (let i = 0; i < n; i++) {
    if (bytes[i] === 0) {
      if (i % 2 === 0) evenNul++
      else oddNul++
    }
  }
  if (oddNul > n / 4 && evenNul === 0) return { encoding: 'utf-16le', bom: false }
  if (evenNul > n / 4 && oddNul === 0) return { encoding: 'utf-16be', bom: false }
  return { encoding: isUtf8(bytes) ? 'utf-8' : 'windows-1252', bom: false }
}

// A character cut off at the end of a sample is not a fault (`stream: true` keeps it pending).
function isUtf8(bytes: Uint8Array): boolean {
  if (bytes.every(byte => byte < 0x80)) return true
  try {
    new TextDecoder('utf-8', { fatal: true }).decode(bytes, { stream: true })
    return true
  }
  catch {
    return false
  }
}

/** Decode a byte prefix; a multi-byte character cut at the end is dropped, not replaced. */
export function decodeSample(bytes: Uint8Array, encoding: SourceEncoding, bom: boolean): string {
  const start = bom ? (encoding === 'utf-8' ? 3 : 2) : 0
  const decoder = new TextDecoder(encoding, { fatal: false })
  return decoder.decode(bytes.subarray(start), { stream: true })
}

// `Â°` is what `°` (C2 B0) looks like when UTF-8 bytes were read as Latin-1 and saved again;
// `Ã‚Â°` is the same mistake made twice. Both only ever mean a degree sign in a log header.
const DOUBLE_ENCODED_DEGREE = /(?:Ã‚)?Â°|Ã‚º|Âº/g

export function repairEncoding(text: string): string {
  return text.replace(DOUBLE_ENCODED_DEGREE, '°')
}

export function detectLineEnding(text: string): LineEnding {
  const lf = text.indexOf('\n')
  const cr = text.indexOf('\r')
  if (cr >= 0 && (lf < 0 || cr < lf - 1)) return 'cr'
  if (cr >= 0 && lf === cr + 1) return 'crlf'
  return 'lf'
}

/** Split on any line ending without keeping the terminators. */
export function splitLines(text: string): string[] {
  return text.split(/\r\n|\n|\r/)
}

/** Split one line into cells, honouring double quotes (RFC 4180) via papaparse. */
export function splitCells(line: string, delimiter: Delimiter): string[] {
  if (!line.includes('"')) return line.split(delimiter)
  const parsed = Papa.parse<string[]>(line, { delimiter, newline: '\n' })
  return parsed.data[0] ?? ['']
}

const CANDIDATES: readonly Delimiter[] = ['\t', ';', ',']

/**
 * The delimiter whose field count is the same on the header and most data lines. A data row may
 * carry one extra field (trailing delimiter). Tab and semicolon are preferred over comma when
 * both fit, because with a decimal comma every line also splits consistently on commas.
 */
export function detectDelimiter(lines: readonly string[]): Delimiter {
  let best: Delimiter | undefined
  let bestScore = 0
  for (const delimiter of CANDIDATES) {
    const header = lines[0]
    if (header === undefined) break
    const headerCount = splitCells(header, delimiter).length
    if (headerCount < 2) continue
    let fits = 0
    let total = 0
    for (let i = 1; i < lines.length && total < 200; i++) {
      const line = lines[i]!
      if (line.trim() === '') continue
      total++
      const count = splitCells(line, delimiter).length
      if (count === headerCount || count === headerCount + 1) fits++
    }
    const score = total === 0 ? 1 : fits / total
    // Strictly better only: the candidate order encodes the preference on ties.
    if (score > bestScore + 1e-9 && score >= 0.8) {
      best = delimiter
      bestScore = score
    }
  }
  if (!best) {
    // Fall back on papaparse's own guess (it weighs field-count consistency over more lines).
    const guess = Papa.parse<string[]>(lines.slice(0, 50).join('\n'), { delimitersToGuess: [...CANDIDATES], preview: 50 })
    const guessed = guess.meta.delimiter
    if (guessed === ',' || guessed === ';' || guessed === '\t') {
      if (splitCells(lines[0] ?? '', guessed).length >= 2) return guessed
    }
    throw new LogImportError('NO_COLUMNS',
      'Could not find columns in this file: the first line should name the columns, separated by commas, semicolons or tabs. '
      + 'Export the log as CSV (one row per sample, a header row with column names) and upload it again.', { line: 1 })
  }
  return best
}

const NUMBER_WITH_SUFFIX = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*([^\d\s+\-.][^\s]*)?$/
const CLOCK = /^(\d{1,3}):(\d{1,2}):(\d{1,2}(?:[.,]\d+)?)$/
const DATETIME = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{1,2}):(\d{2}):(\d{2}(?:[.,]\d+)?)(Z|[+-]\d{2}:?\d{2})?$/

export interface CellReading {
  value: number
  /** Unit glued to the value (`61kPa` → kPa), when recognised. */
  unit?: Unit
}

/** Read one cell as written in the file. NaN for empty and junk cells (hex strings, `N/A`, `--`). */
export function readNumberCell(raw: string, decimalComma: boolean): CellReading {
  let text = raw.trim()
  if (text.length === 0) return { value: Number.NaN }
  if (text.charCodeAt(0) === 34 && text.endsWith('"') && text.length >= 2) text = text.slice(1, -1).trim()
  if (decimalComma) text = text.replace(',', '.')
  const match = NUMBER_WITH_SUFFIX.exec(text)
  if (!match) return { value: Number.NaN }
  const value = Number(match[1])
  const suffix = match[2]
  if (suffix === undefined) return { value }
  const unit = parseUnit(repairEncoding(suffix))
  // An unknown suffix (`4A3F`, `12xyz`) is junk, not a number with a unit.
  if (!unit) return { value: Number.NaN }
  return { value, unit }
}

/** Seconds since midnight (`clock`, `hms`) or since the Unix epoch (date-time); NaN if unreadable. */
export function readTimeCell(raw: string, format: TimeFormat | 'datetime', decimalComma: boolean): number {
  const text = raw.trim()
  if (format === 's' || format === 'ms') {
    const { value } = readNumberCell(text, decimalComma)
    return format === 'ms' ? value / 1000 : value
  }
  if (format === 'datetime') return readDateTime(text)
  const match = CLOCK.exec(text)
  if (!match) return Number.NaN
  return Number(match[1]) * 3600 + Number(match[2]) * 60 + Number(match[3]!.replace(',', '.'))
}

function readDateTime(text: string): number {
  const match = DATETIME.exec(text)
  if (!match) return Number.NaN
  const [, y, mo, d, h, mi, s] = match
  const seconds = Number(s!.replace(',', '.'))
  const whole = Math.floor(seconds)
  // The zone does not matter: only differences between samples are used.
  const ms = Date.UTC(Number(y), Number(mo) - 1, Number(d), Number(h), Number(mi), whole)
  return ms / 1000 + (seconds - whole)
}

const HEADER_UNIT = /^(.*?)[\s_]*[[(]([^\])]*)[\])]\s*$/

/** Split `Intake Air Temperature [°C]` into name and unit; `ENGINE_RPM ()` has an empty unit. */
export function parseHeader(header: string): { name: string, unitText?: string, unit?: Unit } {
  const text = repairEncoding(header.trim().replace(/^"|"$/g, ''))
  const match = HEADER_UNIT.exec(text)
  if (!match) {
    // A few loggers append the unit after an underscore or space (`boost_psi`, `MAP kPa`).
    const tail = /[\s_-]([A-Za-z°/%]+)$/.exec(text)
    const unit = tail ? parseTailUnit(tail[1]!) : undefined
    return { name: text, unit }
  }
  const name = match[1]!.trim()
  const unitText = match[2]!.trim()
  return { name: name.length > 0 ? name : text, unitText, unit: unitText ? parseUnit(unitText) : undefined }
}

// Only unambiguous unit words count at the end of a name: `temp_c` could be many things, so a
// single letter is not read as a unit here.
function parseTailUnit(word: string): Unit | undefined {
  if (word.length < 2 && word !== '%') return undefined
  return parseUnit(word)
}

function quantile(sorted: readonly number[], q: number): number {
  if (sorted.length === 0) return Number.NaN
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))]!
}

function describeColumn(index: number, header: string, cells: readonly string[], decimalComma: boolean): ColumnInfo {
  const { name, unitText, unit } = parseHeader(header)
  const samples: string[] = []
  const values: number[] = []
  const suffixUnits = new Map<Unit, number>()
  let empty = 0
  let clock = 0
  let datetime = 0
  let nonEmpty = 0
  for (const raw of cells) {
    const text = raw.trim()
    if (text === '') {
      empty++
      continue
    }
    nonEmpty++
    if (samples.length < 8) samples.push(text)
    if (CLOCK.test(text)) {
      clock++
      values.push(readTimeCell(text, 'clock', decimalComma))
      continue
    }
    if (DATETIME.test(text)) {
      datetime++
      values.push(readTimeCell(text, 'datetime', decimalComma))
      continue
    }
    const reading = readNumberCell(text, decimalComma)
    if (Number.isFinite(reading.value)) {
      values.push(reading.value)
      if (reading.unit) suffixUnits.set(reading.unit, (suffixUnits.get(reading.unit) ?? 0) + 1)
    }
  }
  const numericShare = nonEmpty === 0 ? 0 : values.length / nonEmpty
  let kind: ColumnKind
  if (nonEmpty === 0) kind = 'empty'
  else if (clock > nonEmpty / 2) kind = 'clock'
  else if (datetime > nonEmpty / 2) kind = 'datetime'
  else if (numericShare < 0.5) kind = 'text'
  else if (suffixUnits.size > 0) kind = 'numeric-with-unit'
  else kind = 'numeric'
  let steps: number[] = []
  for (let i = 1; i < values.length; i++) {
    const step = values[i]! - values[i - 1]!
    if (step > 0) steps.push(step)
  }
  steps = steps.sort((a, b) => a - b)
  const sorted = [...values].sort((a, b) => a - b)
  let glued: Unit | undefined
  let gluedCount = 0
  for (const [u, count] of suffixUnits) {
    if (count > gluedCount) {
      glued = u
      gluedCount = count
    }
  }
  return {
    index,
    header: repairEncoding(header.trim()),
    name,
    unitText,
    unit: unit ?? glued,
    unitFromValues: unit === undefined && glued !== undefined ? true : undefined,
    kind,
    samples,
    numericShare,
    numericCount: values.length,
    emptyShare: cells.length === 0 ? 1 : empty / cells.length,
    median: quantile(sorted, 0.5),
    min: sorted[0] ?? Number.NaN,
    max: sorted[sorted.length - 1] ?? Number.NaN,
    medianStep: quantile(steps, 0.5),
  }
}

/**
 * Look at the start of a log (already decoded) and describe its format and columns.
 * `complete` says the text is the whole source (so a lack of data rows is final).
 */
export function analyseSample(text: string, encoding: SourceEncoding, bom: boolean, complete: boolean): SampleAnalysis {
  const repaired = repairEncoding(text)
  const repairedEncoding = repaired !== text
  let lines = splitLines(repaired)
  // A sample cut mid-line: drop the partial last line.
  if (!complete && lines.length > 1) lines = lines.slice(0, -1)
  let headerLineIndex = 0
  while (headerLineIndex < lines.length && (lines[headerLineIndex]!.trim() === '' || lines[headerLineIndex]!.startsWith('#'))) headerLineIndex++
  if (headerLineIndex >= lines.length) {
    throw new LogImportError('EMPTY_FILE', 'The file is empty: there is no header row and no data. Upload the CSV export of the log itself.')
  }
  const body = lines.slice(headerLineIndex, headerLineIndex + SAMPLE_ROWS + 1)
  const delimiter = detectDelimiter(body)
  const header = splitCells(body[0]!, delimiter)
  // A header written with a trailing delimiter too ends in an empty name: not a column.
  const headerTrailing = header.length > 1 && header[header.length - 1]!.trim() === ''
  if (headerTrailing) header.pop()
  const dataLines = body.slice(1).filter(line => line.trim() !== '')
  if (dataLines.length === 0 && complete) {
    throw new LogImportError('HEADER_ONLY',
      `The file has a header row (${header.length} columns) but no data rows. Check that the logger finished writing, then export again.`, { line: headerLineIndex + 2 })
  }
  const rows = dataLines.map(line => splitCells(line, delimiter))
  const terminator = detectLineEnding(text) === 'crlf' ? 2 : 1
  const charsPerRow = dataLines.length > 0 ? dataLines.reduce((sum, line) => sum + line.length + terminator, 0) / dataLines.length : 64
  const headerIsNumeric = header.every(cell => cell.trim() !== '' && Number.isFinite(readNumberCell(cell, false).value))
  if (headerIsNumeric) {
    throw new LogImportError('NO_COLUMNS',
      'The first line holds numbers, not column names. Add a header row naming each column (for example "Time (s)", "Charge air temp (°C)"), or export the log with headers.', { line: headerLineIndex + 1 })
  }
  let trailing = 0
  for (const row of rows) {
    if (row.length === header.length + 1 && row[row.length - 1]!.trim() === '') trailing++
  }
  const trailingDelimiter = headerTrailing || (rows.length > 0 && trailing > rows.length / 2)
  const decimalComma = delimiter !== ',' && looksLikeDecimalComma(rows)
  const columns = header.map((cell, index) => describeColumn(index, cell, rows.map(row => row[index] ?? ''), decimalComma))
  const seen = new Map<string, number>()
  for (const column of columns) {
    // Duplicate header names would make mapping by name ambiguous: number the repeats.
    const count = seen.get(column.header) ?? 0
    seen.set(column.header, count + 1)
    if (count > 0) column.header = `${column.header} #${count + 1}`
  }
  return {
    format: {
      encoding,
      bom,
      delimiter,
      decimalComma,
      lineEnding: detectLineEnding(text),
      headerLineIndex,
      trailingDelimiter,
      quoted: text.includes('"'),
      repairedEncoding,
    },
    columns,
    rows,
    truncated: !complete,
    charsPerRow,
  }
}

function looksLikeDecimalComma(rows: readonly string[][]): boolean {
  let comma = 0
  let dot = 0
  for (const row of rows.slice(0, 200)) {
    for (const cell of row) {
      if (/^\s*[+-]?\d+,\d+\s*\D*$/.test(cell)) comma++
      else if (/^\s*[+-]?\d+\.\d+\s*\D*$/.test(cell)) dot++
    }
  }
  return comma > dot
}

/** Seconds per unit step of a numeric time column, judged from its values when the header is silent. */
export function guessNumericTimeFormat(column: ColumnInfo): TimeFormat {
  if (column.unit === 'ms') return 'ms'
  if (column.unit === 's') return 's'
  if (/(^|[^a-z])(ms|msec|millis)/i.test(column.header)) return 'ms'
  // Loggers sample between 1 and 100 Hz: a typical step of 5 or more units means milliseconds.
  return column.medianStep >= 5 ? 'ms' : 's'
}
