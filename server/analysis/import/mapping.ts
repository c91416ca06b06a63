// Column → channel mapping: automatic (by header name, unit and value range, with a confidence)
// and explicit (the mapping JSON of issue 3, which always wins). The words matched here are
// generic engineering terms in English and German, not any logging program's labels.
import { CHANNEL_IDS, CHANNELS, TIME_FORMATS, allowedUnits, isChannelId } from '../../../shared/quantities/channels'
import type { ChannelId, TimeFormat, ValueChannelId } from '../../../shared/quantities/channels'
import { FIXED_VALUE_BOUNDS, conditionBoundMessage, conditionInBounds } from '../../../shared/utils/conditions'
import { conversionFor, isUnit, quantityOf, toSI } from '../../../shared/quantities/units'
import type { Unit } from '../../../shared/quantities/units'
import type { ColumnInfo } from './detect'
import { guessNumericTimeFormat } from './detect'
import { LogImportError } from './errors'

/** Unit of a mapped column: a physical unit, or a time format for the time channel. */
export type MappingUnit = Unit | TimeFormat

/** One entry of the mapping JSON a user or profile supplies. */
export interface MappingEntryInput {
  column?: string
  unit?: string
  /** A fixed value instead of a column (baro, ambient temperature, humidity), in `unit`. */
  value?: number
}

/** `{ "chargeTemp": { "column": "Charge air temp (°F)", "unit": "degF" }, "throttle": null }` */
export type MappingInput = Partial<Record<ChannelId, MappingEntryInput | null>>

export type MappingSource = 'auto' | 'explicit' | 'entered' | 'isa'
export type UnitSource = 'header' | 'values' | 'guessed' | 'explicit'

/** One mapped channel in the result: compatible with `MappingEntryInput`, so it can be saved as a profile. */
export interface MappedChannel {
  column?: string
  unit: MappingUnit
  /** Fixed value in `unit` when the channel does not come from a column. */
  value?: number
  /** 0–1: how sure the automatic mapping is (1 for explicit entries). */
  confidence: number
  source: MappingSource
  unitSource: UnitSource
  /** Site altitude used when the value comes from the ISA atmosphere. */
  altitudeM?: number
}

export type LogMapping = Partial<Record<ChannelId, MappedChannel>>

interface NameRule {
  pattern: RegExp
  score: number
}

// Scores are judgement (common practice, no source): an unambiguous name scores about 0.9, a
// name that usually means the channel but not always (e.g. "intake air temperature", which sits
// after the cooler on most boosted engines but before it on some) about 0.7.
const NAME_RULES: Record<ChannelId, NameRule[]> = {
  time: [
    { pattern: /^(time|timestamp|zeit|elapsed|elapsed time|log time|sample time|clock|seconds|secs?|t|time stamp|uhrzeit|zeitstempel)$/, score: 0.95 },
    { pattern: /\b(time|zeit)\b.*\b(s|ms|sec|seconds)\b|^time\b/, score: 0.85 },
    { pattern: /run ?ti[mn]e|runtime|elapsed/, score: 0.8 },
    { pattern: /\btime\b|\bzeit\b/, score: 0.5 },
  ],
  rpm: [
    { pattern: /^(rpm|engine rpm|engine speed|drehzahl|motordrehzahl|revs)$/, score: 0.95 },
    { pattern: /\brpm\b|engine speed|drehzahl/, score: 0.85 },
  ],
  pedal: [
    { pattern: /accelerator pedal|pedal pos|gaspedal|fahrpedal/, score: 0.92 },
    { pattern: /\bpedal\b|accelerator|\bapp\b/, score: 0.85 },
  ],
  throttle: [
    { pattern: /^(throttle|throttle pos(ition)?|absolute throttle pos(ition)?|tps|drosselklappe)$/, score: 0.92 },
    { pattern: /commanded|target|desired|relative|actuator|soll/, score: 0.45 },
    { pattern: /throttle|\btps\b|drossel/, score: 0.7 },
  ],
  manifoldPressure: [
    { pattern: /manifold.*(press|abs)|\bmap\b|intake press|saugrohrdruck|absolute boost|boost.*abs(olute)?\b|ladedruck abs/, score: 0.9 },
  ],
  boost: [
    { pattern: /boost|ladedruck|charge press/, score: 0.85 },
  ],
  baro: [
    { pattern: /baro|atmospheric|ambient press|umgebungsdruck|luftdruck/, score: 0.92 },
  ],
  chargeTemp: [
    { pattern: /charge air temp|charge temp|ladeluft ?temp|post ?(ic|cooler|intercooler)|after (the )?(cooler|ic|intercooler)|manifold air temp|\bmat\b|\bcat\b.*air/, score: 0.95 },
    { pattern: /intake air temp|intake temp|\biat ?\d?\b|ansaugluft ?temp|air temp.*intake/, score: 0.7 },
  ],
  preCoolerTemp: [
    { pattern: /pre ?(ic|cooler|intercooler)|before (the )?(cooler|ic|intercooler)|compressor out|turbo out|vor (dem )?(lk|ladeluftk)/, score: 0.92 },
  ],
  ambientTemp: [
    { pattern: /ambient (air )?temp|outside (air )?temp|outdoor temp|aussen ?temp|außen ?temp|\boat\b|umgebungstemp|^ambient( air)?$/, score: 0.92 },
  ],
  speed: [
    { pattern: /^(speed|vehicle speed|road speed|ground speed|geschwindigkeit|vss)$/, score: 0.92 },
    { pattern: /vehicle speed|road speed|ground speed|gps speed|\bvss\b|geschwindigkeit|\bspeed\b/, score: 0.8 },
  ],
  massAirFlow: [
    { pattern: /mass air ?flow|air ?flow rate|\bmaf\b|air mass|luftmasse|mass flow/, score: 0.92 },
    { pattern: /air ?flow/, score: 0.75 },
  ],
  humidity: [
    { pattern: /humid|\brh\b|feuchte/, score: 0.9 },
  ],
  engineLoad: [
    { pattern: /^(calculated )?(engine )?load( value)?$|calculated (engine )?load|engine load|calc load|motorlast/, score: 0.88 },
  ],
}

// Words that rule a header out for a channel even when a rule above matched.
const EXCLUDE: Partial<Record<ChannelId, RegExp>> = {
  time: /mil|since|codes|trouble|advance|inject|fuel|warm|distance|pulse|timing/,
  speed: /engine|fan|wheel slip|turbo|shaft|idle/,
  chargeTemp: /pre ?(ic|cooler|intercooler)|before|coolant|oil|fuel|exhaust|ambient|outside/,
  ambientTemp: /press/,
  engineLoad: /absolute|abs load|torque/,
  boost: /target|desired|request|soll|abs(olute)?\b|duty|solenoid|limit/,
  manifoldPressure: /target|desired|request|soll|baro/,
  baro: /manifold/,
  rpm: /turbo|fan|shaft|idle target/,
}

// Short forms loggers write, spelled out so one set of rules reads them all (our own list).
const ABBREVIATIONS: Record<string, string> = {
  amb: 'ambient', tmp: 'temp', temperature: 'temp', pos: 'position', posn: 'position', press: 'pressure', prs: 'pressure',
  spd: 'speed', thr: 'throttle', thrtl: 'throttle', accel: 'accelerator', acc: 'accelerator', veh: 'vehicle', eng: 'engine',
  ambiant: 'ambient', intk: 'intake', manf: 'manifold', mnfld: 'manifold',
}
// A unit written as the last word of a name (`ambient_c`, `map_kpa`, `boost psi`): not part of the name.
const TRAILING_UNIT = / (c|f|k|degc|degf|deg c|deg f|kpa|hpa|mbar|bar|psi|psig|psia|pct|percent|kmh|kph|mph|gs|g s|kgh)$/

/**
 * A header name as the rules read it: camelCase split, any case, any separator, short forms
 * spelled out and a trailing unit word dropped (`AmbientTemp`, `AMBIENT_AIR_TEMP`, `Amb. temp`,
 * `ambient_c` all read as "ambient … temp…" or "ambient").
 */
export function normaliseName(name: string): string {
  const spaced = name
    .replace(/([a-z])([A-Z])/g, '$1 $2')
    .replace(/([A-Z]+)([A-Z][a-z])/g, '$1 $2')
    .toLowerCase()
    .replace(/[_\-.:/,;]+/g, ' ')
    .replace(/\s+/g, ' ')
    .trim()
  const words = spaced.split(' ').map(word => ABBREVIATIONS[word] ?? word).join(' ')
  const trimmed = words.replace(TRAILING_UNIT, '').trim()
  return trimmed.length > 0 ? trimmed : words
}

function nameScore(channel: ChannelId, column: ColumnInfo): number {
  const name = normaliseName(column.name)
  if (EXCLUDE[channel]?.test(name)) return 0
  for (const rule of NAME_RULES[channel]) {
    if (rule.pattern.test(name)) return rule.score
  }
  return 0
}

/** Unit a column most likely uses for a channel when the header does not say. */
function guessUnit(channel: ValueChannelId, column: ColumnInfo): Unit {
  const median = Math.abs(column.median)
  const spec = CHANNELS[channel]
  switch (spec.quantity) {
    case 'temperature':
      // Engine-bay temperatures in kelvin sit above 200; in °C or °F below (common practice).
      return median > 200 ? 'K' : 'degC'
    case 'pressure':
      if (channel === 'boost') return median < 3 ? 'bar' : median < 40 ? 'psi' : 'kPa'
      if (median > 5000) return 'Pa'
      if (median > 400) return 'hPa'
      if (median < 5) return 'bar'
      return 'kPa'
    case 'speed':
      return 'km/h'
    case 'massFlow':
      return median > 600 ? 'kg/h' : 'g/s'
    case 'percent':
      return '%'
    case 'rotationalSpeed':
      return 'rpm'
    default:
      return spec.siUnit as Unit
  }
}

function inRange(channel: ValueChannelId, column: ColumnInfo, unit: Unit): boolean {
  if (!Number.isFinite(column.median)) return true
  const { scale, offset } = conversionFor(unit)
  const spec = CHANNELS[channel]
  const median = column.median * scale + offset
  return median >= spec.plausibleMin && median <= spec.plausibleMax
}

interface Candidate {
  channel: ChannelId
  column: ColumnInfo
  unit: MappingUnit
  unitSource: UnitSource
  confidence: number
}

function timeCandidate(column: ColumnInfo, position: number): Candidate | undefined {
  let score = nameScore('time', column)
  let unit: TimeFormat
  if (column.kind === 'clock' || column.kind === 'datetime') {
    score = Math.max(score, 0.75) + 0.1
    // Elapsed H:MM:SS starts near zero; a time of day does not (a log rarely starts at midnight).
    unit = column.kind === 'clock' && column.min < 3600 && normaliseName(column.name).includes('elapsed') ? 'hms' : 'clock'
  }
  else if (column.kind === 'numeric') {
    if (score === 0) return undefined
    unit = guessNumericTimeFormat(column)
    // A time column rises: no positive step at all in the sample means it is something else.
    if (!Number.isFinite(column.medianStep) && column.numericCount >= 3) score *= 0.3
  }
  else {
    return undefined
  }
  // The first column is where loggers put time: a small bonus breaks ties.
  if (position === 0) score += 0.03
  const unitSource: UnitSource = column.unit === 's' || column.unit === 'ms' ? 'header' : (column.kind === 'numeric' ? 'guessed' : 'values')
  return { channel: 'time', column, unit, unitSource, confidence: Math.min(1, score) }
}

function valueCandidate(channel: ValueChannelId, column: ColumnInfo): Candidate | undefined {
  if (column.kind !== 'numeric' && column.kind !== 'numeric-with-unit') return undefined
  let score = nameScore(channel, column)
  const spec = CHANNELS[channel]
  const headerUnit = column.unit && column.unit !== 'ms' && column.unit !== 's' ? column.unit : undefined
  // A unit in the header that fits the channel's quantity can identify it on its own (`[rpm]`).
  if (headerUnit && quantityOf(headerUnit) === spec.quantity) {
    if (score === 0 && (spec.quantity === 'rotationalSpeed' || spec.quantity === 'massFlow')) score = 0.6
    score += 0.05
  }
  else if (headerUnit) {
    score *= 0.3
  }
  if (score === 0) return undefined
  let unit: Unit
  let unitSource: UnitSource
  if (headerUnit && quantityOf(headerUnit) === spec.quantity) {
    unit = headerUnit
    unitSource = column.unitFromValues ? 'values' : 'header'
  }
  else {
    unit = guessUnit(channel, column)
    unitSource = 'guessed'
    score -= 0.1
  }
  if (!inRange(channel, column, unit)) score *= 0.5
  return { channel, column, unit, unitSource, confidence: Math.max(0, Math.min(1, score)) }
}

/**
 * For each numeric column, the unit it most likely uses for each channel its values could be —
 * judged from the values' range when the header names no unit (issue 10: unrecognised columns are
 * offered in the mapping form with their units guessed).
 */
export function unitGuesses(columns: readonly ColumnInfo[]): Record<string, Partial<Record<ValueChannelId, MappingUnit>>> {
  const out: Record<string, Partial<Record<ValueChannelId, MappingUnit>>> = {}
  for (const column of columns) {
    if (column.kind !== 'numeric' && column.kind !== 'numeric-with-unit') continue
    const fits: Partial<Record<ValueChannelId, MappingUnit>> = {}
    for (const channel of CHANNEL_IDS) {
      if (channel === 'time') continue
      const spec = CHANNELS[channel]
      const headerUnit = column.unit && quantityOf(column.unit) === spec.quantity ? column.unit : undefined
      const unit = headerUnit ?? guessUnit(channel, column)
      if (inRange(channel, column, unit)) fits[channel] = unit
    }
    out[column.header] = fits
  }
  return out
}

/** Threshold below which a column is not mapped automatically (the user is asked instead). */
export const MIN_AUTO_CONFIDENCE = 0.4

/**
 * Automatic mapping: every (channel, column) pair is scored and the best pairs are taken greedily,
 * one column per channel and one channel per column. `taken` columns and `skip` channels
 * (explicitly mapped or explicitly disabled) are left alone.
 */
export function autoMap(columns: readonly ColumnInfo[], taken: ReadonlySet<number> = new Set(), skip: ReadonlySet<ChannelId> = new Set()): LogMapping {
  const candidates: Candidate[] = []
  for (const column of columns) {
    if (taken.has(column.index)) continue
    for (const channel of CHANNEL_IDS) {
      if (skip.has(channel)) continue
      const candidate = channel === 'time' ? timeCandidate(column, column.index) : valueCandidate(channel, column)
      if (candidate && candidate.confidence >= MIN_AUTO_CONFIDENCE) candidates.push(candidate)
    }
  }
  // Highest confidence first; on a tie the leftmost column (pedal "D" before "E").
  candidates.sort((a, b) => b.confidence - a.confidence || a.column.index - b.column.index)
  const mapping: LogMapping = {}
  const used = new Set<number>()
  for (const candidate of candidates) {
    if (mapping[candidate.channel] || used.has(candidate.column.index)) continue
    mapping[candidate.channel] = {
      column: candidate.column.header,
      unit: candidate.unit,
      confidence: round2(candidate.confidence),
      source: 'auto',
      unitSource: candidate.unitSource,
    }
    used.add(candidate.column.index)
  }
  return mapping
}

function round2(value: number): number {
  return Math.round(value * 100) / 100
}

/** Find a column by the name a user typed: exact, then case-insensitive, then without the unit part. */
export function findColumn(columns: readonly ColumnInfo[], wanted: string): ColumnInfo | undefined {
  const exact = columns.find(c => c.header === wanted)
  if (exact) return exact
  const lower = wanted.trim().toLowerCase()
  const loose = columns.find(c => c.header.toLowerCase() === lower)
  if (loose) return loose
  const name = normaliseName(wanted)
  return columns.find(c => normaliseName(c.name) === name || normaliseName(c.header) === name)
}

/** Validate mapping JSON (a string or an object) into a `MappingInput`. */
export function parseMappingInput(input: unknown): MappingInput {
  let value = input
  if (typeof input === 'string') {
    try {
      value = JSON.parse(input)
    }
    catch (error) {
      throw new LogImportError('BAD_MAPPING', `The column mapping is not valid JSON (${(error as Error).message}). Expected an object such as {"chargeTemp": {"column": "Charge air temp (°C)", "unit": "degC"}}.`)
    }
  }
  if (value === null || typeof value !== 'object' || Array.isArray(value)) {
    throw new LogImportError('BAD_MAPPING', 'The column mapping must be a JSON object keyed by channel name, e.g. {"chargeTemp": {"column": "Charge air temp (°C)", "unit": "degC"}}.')
  }
  const result: MappingInput = {}
  for (const [key, entry] of Object.entries(value as Record<string, unknown>)) {
    if (!isChannelId(key)) {
      throw new LogImportError('BAD_MAPPING', `The column mapping names an unknown channel "${key}". Use one of: ${CHANNEL_IDS.join(', ')}.`, { channel: key })
    }
    if (entry === null || entry === false) {
      result[key] = null
      continue
    }
    if (typeof entry !== 'object' || Array.isArray(entry)) {
      throw new LogImportError('BAD_MAPPING', `The mapping for "${key}" must be an object with "column" and "unit" (or "value" and "unit"), or null to leave it unmapped.`, { channel: key })
    }
    const { column, unit, value: fixed } = entry as Record<string, unknown>
    if (column !== undefined && typeof column !== 'string') {
      throw new LogImportError('BAD_MAPPING', `The mapping for "${key}" has a "column" that is not text. Give the column name exactly as in the file's header.`, { channel: key })
    }
    if (unit !== undefined && typeof unit !== 'string') {
      throw new LogImportError('BAD_MAPPING', `The mapping for "${key}" has a "unit" that is not text. Use one of: ${allowedUnits(key).join(', ')}.`, { channel: key })
    }
    if (fixed !== undefined && (typeof fixed !== 'number' || !Number.isFinite(fixed))) {
      throw new LogImportError('BAD_MAPPING', `The mapping for "${key}" has a "value" that is not a number.`, { channel: key })
    }
    if (column === undefined && fixed === undefined) {
      throw new LogImportError('BAD_MAPPING', `The mapping for "${key}" needs a "column" (the header name in the file) or a fixed "value".`, { channel: key })
    }
    if (fixed !== undefined && key === 'time') {
      throw new LogImportError('BAD_MAPPING', 'Time must come from a column; a fixed value makes no sense for it.', { channel: key })
    }
    if (unit !== undefined && !allowedUnits(key).includes(unit)) {
      throw new LogImportError('BAD_UNIT', `Unit "${unit}" is not valid for ${key}. Use one of: ${allowedUnits(key).join(', ')}.`, { channel: key })
    }
    if (fixed !== undefined && key in FIXED_VALUE_BOUNDS) checkFixedValue(key as keyof typeof FIXED_VALUE_BOUNDS, fixed as number, unit)
    result[key] = { column, unit, value: fixed as number | undefined }
  }
  return result
}

// A fixed value obeys the same bounds as the condition the upload form asks for (shared/utils/conditions).
function checkFixedValue(channel: keyof typeof FIXED_VALUE_BOUNDS, value: number, unit: string | undefined): void {
  const { condition, fromSI } = FIXED_VALUE_BOUNDS[channel]
  const siUnit = CHANNELS[channel].siUnit as Unit
  const inConditionUnit = fromSI(toSI(value, (unit ?? siUnit) as Unit))
  if (!conditionInBounds(condition, inConditionUnit)) {
    throw new LogImportError('BAD_MAPPING', `${conditionBoundMessage(condition)}; the column mapping gives it as a fixed ${value} ${unit ?? siUnit}. Correct the value and try again.`, { channel })
  }
}

/**
 * The full mapping for a file: explicit entries first (validated against the columns), the rest
 * mapped automatically. Throws when an explicit entry names a column the file does not have.
 */
export function resolveMapping(columns: readonly ColumnInfo[], input: MappingInput | undefined): LogMapping {
  const explicit: LogMapping = {}
  const taken = new Set<number>()
  const skip = new Set<ChannelId>()
  for (const channel of CHANNEL_IDS) {
    if (!input || !(channel in input)) continue
    const entry = input[channel]
    skip.add(channel)
    if (entry === null || entry === undefined) continue
    if (entry.column !== undefined) {
      const column = findColumn(columns, entry.column)
      if (!column) {
        throw new LogImportError('UNKNOWN_COLUMN',
          `The mapping for ${channel} names column "${entry.column}", which is not in this file. Columns found: ${columns.map(c => `"${c.header}"`).join(', ')}.`,
          { column: entry.column, channel, line: 1 })
      }
      const auto = channel === 'time' ? timeCandidate(column, column.index) : valueCandidate(channel, column)
      const unit = (entry.unit ?? auto?.unit ?? defaultUnit(channel, column)) as MappingUnit
      explicit[channel] = { column: column.header, unit, confidence: 1, source: 'explicit', unitSource: entry.unit ? 'explicit' : (auto?.unitSource ?? 'guessed') }
      taken.add(column.index)
    }
    else if (entry.value !== undefined) {
      const unit = (entry.unit ?? (channel === 'time' ? 's' : CHANNELS[channel].siUnit)) as MappingUnit
      explicit[channel] = { value: entry.value, unit, confidence: 1, source: 'entered', unitSource: entry.unit ? 'explicit' : 'guessed' }
    }
  }
  const auto = autoMap(columns, taken, skip)
  const merged: LogMapping = {}
  for (const channel of CHANNEL_IDS) {
    const entry = explicit[channel] ?? auto[channel]
    if (entry) merged[channel] = entry
  }
  return merged
}

function defaultUnit(channel: ChannelId, column: ColumnInfo): MappingUnit {
  if (channel === 'time') return guessNumericTimeFormat(column)
  return guessUnit(channel, column)
}

export function isTimeFormat(unit: string): unit is TimeFormat {
  return (TIME_FORMATS as readonly string[]).includes(unit)
}

export function isPhysicalUnit(unit: string): unit is Unit {
  return isUnit(unit)
}
