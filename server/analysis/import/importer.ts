// From a source (text, bytes or a file path) to canonical SI channels: sample → detect → map →
// stream-parse → derive (boost + baro → absolute MAP). Every failure is a LogImportError.
import { Buffer } from 'node:buffer'
import { open } from 'node:fs/promises'
import { CONDITION_BOUNDS } from '../../../shared/utils/conditions'
import { isaPressureAtElevationPa } from '../atmosphere'
import { CHANNELS, MAPPABLE_CHANNELS, VALUE_CHANNEL_IDS, mappingUnitLabel } from '../../../shared/quantities/channels'
import type { ChannelId, LogChannels, TimeFormat, ValueChannelId } from '../../../shared/quantities/channels'
import { P0_PA } from '../constants'
import { conversionFor } from '../../../shared/quantities/units'
import type { Unit } from '../../../shared/quantities/units'
import { SAMPLE_BYTES, analyseSample, decodeSample, detectEncoding } from './detect'
import type { ColumnInfo, DetectedFormat } from './detect'
import { LogImportError } from './errors'
import { isPhysicalUnit, isTimeFormat, parseMappingInput, resolveMapping, unitGuesses } from './mapping'
import type { LogMapping, MappingInput } from './mapping'
import { driveInfo, drivesFromBreaks, sliceDrive } from './drives'
import type { DriveInfo } from './drives'
import { parseSource } from './parse'
import type { ParsePlan, ParseResult, ParseSource, SlotPlan } from './parse'

export type LogSource = string | Uint8Array | { path: string }

export interface ImportOptions {
  /** Explicit mapping (object or JSON text); entries override the automatic mapping. */
  mapping?: MappingInput | string
  /** Site altitude, m (geometric), for ISA barometric pressure when a gauge boost column needs it. */
  altitudeM?: number
  /** Barometric pressure entered by the user, kPa. */
  baroKpa?: number
  /** Hold the last value of an empty cell for at most this long, s (default 5). */
  staleLimitS?: number
  /** Refuse logs with more rows than this (default 2 000 000). */
  maxRows?: number
  /**
   * Which drive to import (0-based) when the file holds several joined drives. Without it such a
   * file is refused with SEVERAL_DRIVES, listing the drives, so nothing is analysed by accident.
   */
  drive?: number
}

export interface ImportWarning {
  code: string
  message: string
  channel?: ChannelId
  column?: string
  line?: number
}

export interface ColumnSummary {
  index: number
  header: string
  name: string
  unit?: string
  kind: ColumnInfo['kind']
  /** Channel this column feeds, if any. */
  channel?: ChannelId
}

export interface ImportedLog {
  channels: LogChannels
  mapping: LogMapping
  warnings: ImportWarning[]
  format: DetectedFormat
  columns: ColumnSummary[]
  rowCount: number
  durationS: number
  /** Time of day of the first sample (s after midnight) when the log records clock time. */
  startClockS?: number
  /** Stable fingerprint of the header names (to offer a saved log profile for the same logger). */
  headerSignature: string
  /** Every drive found in the file (one for an ordinary log). */
  drives: DriveInfo[]
  /** The drive imported when the file holds several; null when it holds one. */
  driveIndex: number | null
}

export interface ColumnPreview {
  format: DetectedFormat
  columns: ColumnInfo[]
  /** First data rows as written (cells as text). */
  rows: string[][]
  mapping: LogMapping
  headerSignature: string
  /** The log has no ambient channel: the user must enter the ambient temperature. */
  needsAmbientTemp: boolean
  /** A gauge boost column without a baro column: enter baro or altitude (ISA is used otherwise). */
  needsBaro: boolean
  warnings: ImportWarning[]
  /** Per numeric column, the unit guessed from its values for each channel it could be. */
  unitGuesses: Record<string, Partial<Record<ValueChannelId, string>>>
  /** Numeric columns that no channel took but whose values fit one: offered in the mapping form. */
  unrecognised: string[]
}

export const DEFAULT_STALE_LIMIT_S = 5
export const DEFAULT_MAX_ROWS = 2_000_000

interface OpenedSource {
  head: Uint8Array
  complete: boolean
  size: number
  parse: ParseSource
}

async function openSource(source: LogSource): Promise<OpenedSource> {
  if (typeof source === 'string') {
    const bytes = Buffer.from(source, 'utf8')
    return { head: bytes.subarray(0, SAMPLE_BYTES), complete: bytes.length <= SAMPLE_BYTES, size: bytes.length, parse: { kind: 'bytes', bytes } }
  }
  if (source instanceof Uint8Array) {
    return { head: source.subarray(0, SAMPLE_BYTES), complete: source.length <= SAMPLE_BYTES, size: source.length, parse: { kind: 'bytes', bytes: source } }
  }
  if (!source || typeof source.path !== 'string') {
    throw new LogImportError('BAD_OPTION', 'importLog needs the log as text, bytes, or { path } of a file.')
  }
  let handle
  try {
    handle = await open(source.path, 'r')
    const { size } = await handle.stat()
    const head = Buffer.alloc(Math.min(size, SAMPLE_BYTES))
    let read = 0
    while (read < head.length) {
      const { bytesRead } = await handle.read(head, read, head.length - read, read)
      if (bytesRead === 0) break
      read += bytesRead
    }
    return { head: head.subarray(0, read), complete: size <= SAMPLE_BYTES, size, parse: { kind: 'file', path: source.path } }
  }
  catch (error) {
    const code = (error as NodeJS.ErrnoException).code
    throw new LogImportError('FILE_UNREADABLE', code === 'ENOENT'
      ? `The log file was not found (${source.path}). Check the path and try again.`
      : `The log file could not be read (${code ?? (error as Error).message}). Check that it exists and is readable, then try again.`)
  }
  finally {
    await handle?.close()
  }
}

const ZIP_MAGIC = [0x50, 0x4B, 0x03, 0x04]
const OLE_MAGIC = [0xD0, 0xCF, 0x11, 0xE0]

function assertText(head: Uint8Array, encoding: string): void {
  if (head.length === 0) throw new LogImportError('EMPTY_FILE', 'The file is empty. Upload the CSV export of the log itself.')
  const starts = (magic: number[]) => magic.every((byte, i) => head[i] === byte)
  if (starts(ZIP_MAGIC) || starts(OLE_MAGIC)) {
    throw new LogImportError('NOT_TEXT', 'This looks like a spreadsheet or archive, not a CSV text file. Open it in the spreadsheet program, save it as CSV (comma or semicolon separated), and upload that file.')
  }
  // UTF-16 has a NUL in every other byte of plain text; the control-character count is for 8-bit text.
  if (encoding === 'utf-16le' || encoding === 'utf-16be') return
  let control = 0
  for (let i = 0; i < head.length; i++) {
    const b = head[i]!
    if (b < 9 || (b > 13 && b < 32 && b !== 27)) control++
  }
  // Text logs contain no control characters apart from tab and line breaks (a few stray bytes are tolerated).
  if (control > Math.max(2, head.length / 100)) {
    throw new LogImportError('NOT_TEXT', 'This file is not readable text (it contains binary data). Export the log from the logger as CSV text and upload that file.')
  }
}

/** FNV-1a over the normalised header names: same logger layout → same signature. */
export function headerSignature(columns: readonly ColumnInfo[]): string {
  let hash = 0x811C9DC5
  const text = columns.map(c => c.header.trim().toLowerCase()).join('\u0001')
  for (let i = 0; i < text.length; i++) {
    hash ^= text.charCodeAt(i)
    hash = Math.imul(hash, 0x01000193) >>> 0
  }
  return `${columns.length}-${hash.toString(16).padStart(8, '0')}`
}

function checkNumberOption(name: string, value: number | undefined, min: number, max: number, unit: string): void {
  if (value === undefined) return
  if (typeof value !== 'number' || !Number.isFinite(value) || value < min || value > max) {
    throw new LogImportError('BAD_OPTION', `${name} must be a number between ${min} and ${max} ${unit}; got ${String(value)}.`)
  }
}

async function sampleOf(source: LogSource) {
  const opened = await openSource(source)
  const { encoding, bom } = detectEncoding(opened.head)
  assertText(opened.head, encoding)
  const text = decodeSample(opened.head, encoding, bom)
  if (text.trim() === '') throw new LogImportError('EMPTY_FILE', 'The file is empty (only blank lines). Upload the CSV export of the log itself.')
  const sample = analyseSample(text, encoding, bom, opened.complete)
  return { opened, text, sample }
}

// Messages name a channel and a unit as the column form shows them, never by their code.
const channelWords = (channel: ChannelId) => {
  const label = MAPPABLE_CHANNELS.find(c => c.id === channel)?.label ?? channel
  return label.charAt(0).toLowerCase() + label.slice(1)
}

function mappingWarnings(mapping: LogMapping): ImportWarning[] {
  const warnings: ImportWarning[] = []
  for (const [channel, entry] of Object.entries(mapping) as [ChannelId, NonNullable<LogMapping[ChannelId]>][]) {
    if (entry.source === 'auto' && entry.confidence < 0.7) {
      warnings.push({
        code: 'LOW_CONFIDENCE_MAPPING',
        channel,
        column: entry.column,
        message: `Column "${entry.column}" was taken as the ${channelWords(channel)}, with a confidence of only ${Math.round(entry.confidence * 100)} %. Check the mapping and correct it if that is wrong.`,
      })
    }
  }
  // Percent and rpm have one unit only; the others are worth a look when the header was silent.
  const guessed = (Object.entries(mapping) as [ChannelId, NonNullable<LogMapping[ChannelId]>][])
    .filter(([channel, entry]) => entry.unitSource === 'guessed' && entry.column && entry.unit !== '%' && entry.unit !== 'rpm' && channel !== 'pedal')
  if (guessed.length > 0) {
    warnings.push({
      code: 'UNIT_GUESSED',
      message: `These columns do not state their unit, so it was judged from the values: ${guessed.map(([channel, e]) => `"${e.column}" as ${channelWords(channel)}, in ${mappingUnitLabel(channel, e.unit)}`).join('; ')}. Set the unit in the mapping if any is wrong.`,
    })
  }
  return warnings
}

/** Detect format and mapping from the start of a log, for the upload form. */
export async function previewColumns(source: LogSource, options: { rows?: number, mapping?: MappingInput | string } = {}): Promise<ColumnPreview> {
  const { sample } = await sampleOf(source)
  const input = options.mapping === undefined ? undefined : parseMappingInput(options.mapping)
  const mapping = resolveMapping(sample.columns, input)
  return {
    format: sample.format,
    columns: sample.columns,
    rows: sample.rows.slice(0, options.rows ?? 20),
    mapping,
    headerSignature: headerSignature(sample.columns),
    needsAmbientTemp: !mapping.ambientTemp,
    needsBaro: Boolean(mapping.boost && !mapping.baro && !mapping.manifoldPressure),
    warnings: mappingWarnings(mapping),
    ...offered(sample.columns, mapping),
  }
}

function offered(columns: readonly ColumnInfo[], mapping: LogMapping): Pick<ColumnPreview, 'unitGuesses' | 'unrecognised'> {
  const guesses = unitGuesses(columns)
  const used = new Set(Object.values(mapping).map(entry => entry?.column).filter(Boolean))
  const unrecognised = columns
    .filter(c => !used.has(c.header) && Object.keys(guesses[c.header] ?? {}).length > 0 && c.min !== c.max)
    .map(c => c.header)
  return { unitGuesses: guesses, unrecognised }
}

function columnsByHeader(columns: readonly ColumnInfo[]): Map<string, ColumnInfo> {
  return new Map(columns.map(c => [c.header, c]))
}

/** Import a log into canonical SI channels. */
export async function importLog(source: LogSource, options: ImportOptions = {}): Promise<ImportedLog> {
  checkNumberOption('altitudeM', options.altitudeM, CONDITION_BOUNDS.altitudeM.min, CONDITION_BOUNDS.altitudeM.max, 'm')
  checkNumberOption('baroKpa', options.baroKpa, CONDITION_BOUNDS.baroKpa.min, CONDITION_BOUNDS.baroKpa.max, 'kPa')
  checkNumberOption('staleLimitS', options.staleLimitS, 0, 3600, 's')
  checkNumberOption('maxRows', options.maxRows, 1, 1e9, 'rows')
  const { opened, text, sample } = await sampleOf(source)
  const input = options.mapping === undefined ? undefined : parseMappingInput(options.mapping)
  const mapping = resolveMapping(sample.columns, input)
  const byHeader = columnsByHeader(sample.columns)
  const columnList = () => sample.columns.map(c => `"${c.header}"`).join(', ')

  const time = mapping.time
  const timeColumn = time?.column ? byHeader.get(time.column) : undefined
  if (!time || !timeColumn) {
    throw new LogImportError('NO_TIME_COLUMN',
      `No time column was recognised. Columns found: ${columnList()}. Map the time column explicitly, e.g. {"time": {"column": "<name>", "unit": "s"}} (units: s, ms, clock for time of day, hms for elapsed H:MM:SS).`,
      { channel: 'time', line: 1 })
  }
  if (!mapping.chargeTemp?.column) {
    throw new LogImportError('NO_TEMPERATURE_COLUMN',
      `No charge-air (or intake-air) temperature column was recognised, and the analysis needs one. Columns found: ${columnList()}. Map it explicitly, e.g. {"chargeTemp": {"column": "<name>", "unit": "degC"}}.`,
      { channel: 'chargeTemp', line: 1 })
  }

  const slots: SlotPlan[] = []
  for (const channel of VALUE_CHANNEL_IDS) {
    const entry = mapping[channel]
    if (!entry?.column) continue
    const column = byHeader.get(entry.column)
    if (!column) continue
    if (!isPhysicalUnit(entry.unit)) {
      throw new LogImportError('BAD_UNIT', `Unit "${entry.unit}" is not valid for ${channel} (column "${entry.column}").`, { channel, column: entry.column })
    }
    slots.push({ channel, columnIndex: column.index, header: column.header, unit: entry.unit as Unit })
  }
  const timeFormat: TimeFormat | 'datetime' = timeColumn.kind === 'datetime' ? 'datetime' : (isTimeFormat(time.unit) ? time.unit : 's')

  // Size the arrays from the sample's line length, with 3 % headroom; they grow if short.
  // (Characters ≈ bytes: logs are ASCII apart from the header's degree signs.)
  const expectedRows = Math.ceil(opened.size / Math.max(4, sample.charsPerRow) * 1.03) + 16
  const plan: ParsePlan = {
    format: sample.format,
    columnCount: sample.columns.length,
    timeColumnIndex: timeColumn.index,
    timeHeader: timeColumn.header,
    timeFormat,
    slots,
    staleLimitS: options.staleLimitS ?? DEFAULT_STALE_LIMIT_S,
    maxRows: options.maxRows ?? DEFAULT_MAX_ROWS,
    expectedRows,
  }
  const parsed = await parseSource(opened.parse, plan, text)
  const warnings = mappingWarnings(mapping)
  const joined = assembleChannels(parsed, plan, mapping, warnings, options)
  const { drives, droppedRows } = drivesFromBreaks(parsed.timeS, parsed.rowCount, parsed.driveBreaks, joined)
  if (droppedRows > 0) {
    warnings.push({ code: 'DRIVE_FRAGMENTS', column: plan.timeHeader, message: `${droppedRows} row(s) where the time jumped were too few to be a drive of their own and were left out.` })
  }
  if (drives.length === 0) {
    throw new LogImportError('NO_USABLE_ROWS', 'The file has no stretch of rows with a steadily rising time. Check the time column, then upload again.')
  }
  const infos = drives.map(driveInfo)
  let channels = joined
  let driveIndex: number | null = null
  let rowCount = parsed.rowCount
  if (options.drive !== undefined) {
    if (!Number.isInteger(options.drive) || options.drive < 0 || options.drive >= drives.length) {
      throw new LogImportError('BAD_DRIVE', drives.length === 1
        ? `The file holds one drive, so there is no drive ${String(options.drive)} to choose. Leave the drive choice out.`
        : `The file holds ${drives.length} drives, numbered 0 to ${drives.length - 1}; there is no drive ${String(options.drive)}.`, { drives: infos })
    }
    if (drives.length > 1) {
      const drive = drives[options.drive]!
      channels = sliceDrive(joined, drive.fromRow, drive.toRow)
      driveIndex = drive.index
      rowCount = drive.rows
    }
  }
  else if (drives.length > 1) {
    throw new LogImportError('SEVERAL_DRIVES',
      `This file holds ${drives.length} drives joined together (the time runs backwards or jumps at line${drives.length > 2 ? 's' : ''} ${drives.slice(1).map(d => d.line).join(', ')}). Choose which drive to analyse, or all of them, each as its own log.`,
      { drives: infos, column: plan.timeHeader })
  }
  else if (drives[0]!.rows !== parsed.rowCount) {
    // One drive plus dropped fragments: keep only the drive.
    channels = sliceDrive(joined, drives[0]!.fromRow, drives[0]!.toRow)
    rowCount = drives[0]!.rows
  }

  return {
    drives: infos,
    driveIndex,
    channels,
    mapping,
    warnings,
    format: sample.format,
    columns: sample.columns.map(c => ({
      index: c.index,
      header: c.header,
      name: c.name,
      unit: c.unit,
      kind: c.kind,
      channel: (Object.keys(mapping) as ChannelId[]).find(id => mapping[id]?.column === c.header),
    })),
    rowCount,
    durationS: rowCount > 0 ? channels.timeS[rowCount - 1]! : 0,
    startClockS: driveIndex !== null
      ? (Number.isFinite(parsed.firstClockS) ? infos[driveIndex]!.startS : undefined)
      : (Number.isFinite(parsed.firstClockS) ? parsed.firstClockS : undefined),
    headerSignature: headerSignature(sample.columns),
  }
}

/** The drives a file holds (one for an ordinary log), for the upload page and the command line. */
export async function listDrives(source: LogSource, options: Omit<ImportOptions, 'drive'> = {}): Promise<DriveInfo[]> {
  try {
    return (await importLog(source, options)).drives
  }
  catch (error) {
    if (error instanceof LogImportError && error.code === 'SEVERAL_DRIVES' && error.drives) return error.drives as DriveInfo[]
    throw error
  }
}

function assembleChannels(parsed: ParseResult, plan: ParsePlan, mapping: LogMapping, warnings: ImportWarning[], options: ImportOptions): LogChannels {
  if (parsed.rowCount === 0) {
    if (parsed.skippedRows > 0) {
      throw new LogImportError('BAD_TIME_VALUE',
        `The time column "${plan.timeHeader}" could not be read on any row (first at line ${parsed.firstSkippedLine}: "${parsed.firstSkippedText}"). Expected ${describeTimeFormat(plan.timeFormat)}. Set the time unit in the mapping (s, ms, clock, hms).`,
        { column: plan.timeHeader, line: parsed.firstSkippedLine, channel: 'time' })
    }
    throw new LogImportError('NO_USABLE_ROWS', 'The file has a header but no data rows that could be read. Check that the export contains samples, then upload again.')
  }
  if (parsed.skippedRows > 0) {
    warnings.push({
      code: 'ROWS_WITHOUT_TIME',
      column: plan.timeHeader,
      line: parsed.firstSkippedLine,
      message: `${parsed.skippedRows} row(s) had no readable time in "${plan.timeHeader}" and were left out (first at line ${parsed.firstSkippedLine}: "${parsed.firstSkippedText}").`,
    })
  }
  if (parsed.backwardsRows > 0) {
    warnings.push({
      code: 'TIME_WENT_BACKWARDS',
      column: plan.timeHeader,
      line: parsed.firstBackwardsLine,
      message: `${parsed.backwardsRows} row(s) had a time earlier than the row before and were left out (first at line ${parsed.firstBackwardsLine}). Is the file two logs joined together?`,
    })
  }
  if (parsed.midnightWraps > 0) {
    warnings.push({ code: 'MIDNIGHT_WRAP', column: plan.timeHeader, message: `The time of day passed midnight ${parsed.midnightWraps} time(s); the day change was accounted for.` })
  }
  const channels: LogChannels = { timeS: parsed.timeS }
  plan.slots.forEach((slot, i) => {
    const stats = parsed.stats[i]!
    const values = parsed.values[i]!
    const valid = parsed.rowCount - stats.missing
    if (stats.junk > 0) {
      warnings.push({
        code: 'JUNK_CELLS',
        channel: slot.channel,
        column: slot.header,
        line: stats.firstJunkLine,
        message: `${stats.junk} cell(s) in "${slot.header}" were not numbers (first at line ${stats.firstJunkLine}: "${stats.firstJunkText}") and were treated as missing.`,
      })
    }
    if (stats.outOfRange > 0) {
      warnings.push({
        code: 'OUT_OF_RANGE',
        channel: slot.channel,
        column: slot.header,
        message: `${stats.outOfRange} value(s) in "${slot.header}" are outside what a sensor can read for the ${channelWords(slot.channel)}, taking the unit as ${mappingUnitLabel(slot.channel, slot.unit)}, and were treated as missing. Check the unit in the mapping.`,
      })
    }
    if (stats.held > parsed.rowCount * 0.2) {
      warnings.push({
        code: 'SPARSE_ROWS',
        channel: slot.channel,
        column: slot.header,
        message: `"${slot.header}" is filled on only some rows (round-robin logging): the last value was held for up to ${plan.staleLimitS} s on ${Math.round(100 * stats.held / parsed.rowCount)} % of rows.`,
      })
    }
    if (valid === 0) {
      if (slot.channel === 'chargeTemp') {
        throw new LogImportError('NO_TEMPERATURE_COLUMN',
          `The charge-air temperature column "${slot.header}" has no readable numbers${stats.firstJunkLine ? ` (line ${stats.firstJunkLine}: "${stats.firstJunkText}")` : ''}. Map a column that holds temperatures, with its unit (degC, degF or K).`,
          { column: slot.header, channel: 'chargeTemp', line: stats.firstJunkLine || undefined })
      }
      warnings.push({ code: 'EMPTY_CHANNEL', channel: slot.channel, column: slot.header, message: `"${slot.header}" (${slot.channel}) has no readable values and is ignored.` })
      return
    }
    channels[CHANNELS[slot.channel].field] = values
  })
  deriveManifoldPressure(channels, mapping, warnings, options)
  return channels
}

function describeTimeFormat(format: TimeFormat | 'datetime'): string {
  switch (format) {
    case 's': return 'seconds (e.g. 12.5)'
    case 'ms': return 'milliseconds (e.g. 12500)'
    case 'clock': return 'a time of day HH:MM:SS.mmm'
    case 'hms': return 'elapsed time H:MM:SS'
    case 'datetime': return 'a date and time YYYY-MM-DD HH:MM:SS'
  }
}

/**
 * Gauge boost → absolute manifold pressure, p_abs = p_gauge + p_baro (common practice, reference
 * sheet §10). Baro from a column, else the value entered, else ISA at the site altitude — the
 * mapping records which.
 */
function deriveManifoldPressure(channels: LogChannels, mapping: LogMapping, warnings: ImportWarning[], options: ImportOptions): void {
  const boost = channels.boostPa
  if (!boost || channels.manifoldPressurePa) return
  const absolute = new Float32Array(boost.length)
  const baroColumn = channels.baroPa
  if (baroColumn) {
    for (let i = 0; i < boost.length; i++) absolute[i] = boost[i]! + baroColumn[i]!
    if (mapping.baro) mapping.baro.source = mapping.baro.source === 'explicit' ? 'explicit' : 'auto'
  }
  else {
    let baroPa: number
    const entered = mapping.baro?.value
    if (entered !== undefined && mapping.baro && isPhysicalUnit(mapping.baro.unit)) {
      const { scale, offset } = conversionFor(mapping.baro.unit)
      baroPa = entered * scale + offset
    }
    else if (options.baroKpa !== undefined) {
      baroPa = options.baroKpa * 1000
      mapping.baro = { value: options.baroKpa, unit: 'kPa', confidence: 1, source: 'entered', unitSource: 'explicit' }
    }
    else {
      const altitudeM = options.altitudeM ?? 0
      baroPa = isaPressureAtElevationPa(altitudeM)
      mapping.baro = { value: Math.round(baroPa / 10) / 100, unit: 'kPa', confidence: 0.5, source: 'isa', unitSource: 'guessed', altitudeM }
      warnings.push({
        code: 'BARO_FROM_ISA',
        channel: 'baro',
        message: options.altitudeM === undefined
          ? `The boost column is gauge pressure and the log has no barometer: ${(P0_PA / 1000).toFixed(3)} kPa (ISA sea level) was assumed. Enter the site altitude or the barometric pressure for a better absolute pressure.`
          : `The boost column is gauge pressure and the log has no barometer: ISA pressure at ${altitudeM} m (${(baroPa / 1000).toFixed(2)} kPa) was used.`,
      })
    }
    for (let i = 0; i < boost.length; i++) absolute[i] = boost[i]! + baroPa
  }
  channels.manifoldPressurePa = absolute
}

/** Unit helpers re-used by the analysis for fixed values from a mapping. */
export function mappedFixedValueSI(mapping: LogMapping, channel: ValueChannelId): number | undefined {
  const entry = mapping[channel]
  if (!entry || entry.value === undefined || !isPhysicalUnit(entry.unit)) return undefined
  const { scale, offset } = conversionFor(entry.unit)
  return entry.value * scale + offset
}
