// The channel catalogue: the vocabulary every logger column is mapped onto, for the engine (import,
// analysis, series), the server (validation) and the upload's column form. The channel id (left)
// is what mapping JSON, profiles and the series API use; the `LogChannels` field (right) carries
// the SI unit in its name, because that is what the arrays hold once imported. Plain TypeScript
// with relative imports only (the engine's worker bundle and scripts load it).
import { SI_UNIT, UNITS, unitSymbol, type Quantity, type Unit } from './units'

export const CHANNEL_IDS = [
  'time',
  'rpm',
  'throttle',
  'pedal',
  'manifoldPressure',
  'boost',
  'baro',
  'chargeTemp',
  'preCoolerTemp',
  'ambientTemp',
  'speed',
  'massAirFlow',
  'humidity',
  'engineLoad',
] as const

export type ChannelId = typeof CHANNEL_IDS[number]
/** Every channel except time, which is the row axis rather than a sampled value. */
export type ValueChannelId = Exclude<ChannelId, 'time'>

/** How a time column is written: seconds, milliseconds, time of day, or elapsed H:MM:SS. */
export const TIME_FORMATS = ['s', 'ms', 'clock', 'hms'] as const
export type TimeFormat = typeof TIME_FORMATS[number]

const TIME_FORMAT_WORDS: Record<TimeFormat, string> = { s: 'seconds', ms: 'milliseconds', clock: 'time of day', hms: 'h:mm:ss elapsed' }

export interface ChannelSpec {
  readonly id: ValueChannelId
  /** Field of `LogChannels` holding the converted samples. */
  readonly field: ValueFieldName
  readonly quantity: Quantity
  /** Unit of the stored samples (SI except %, rpm): the quantity's `SI_UNIT`. */
  readonly siUnit: Unit
  /** The glossary's word for it, as a screen or message names it. */
  readonly label: string
  /**
   * Said beside the label where the name alone could be mistaken (the column form): where the
   * sensor sits, or whether the pressure is absolute or gauge. Charts leave it out.
   */
  readonly detail?: string
  /** Plausible range in SI; samples outside are treated as missing (a junk cell, not a reading). */
  readonly plausibleMin: number
  readonly plausibleMax: number
}

export interface LogChannels {
  /** Seconds from the first sample; strictly the row axis, non-decreasing. */
  timeS: Float64Array
  rpm?: Float32Array
  throttlePct?: Float32Array
  pedalPct?: Float32Array
  /** Absolute manifold pressure. Derived from gauge boost + baro when the log has only boost. */
  manifoldPressurePa?: Float32Array
  /** Gauge boost as logged (kept for charts; analysis uses manifoldPressurePa). */
  boostPa?: Float32Array
  baroPa?: Float32Array
  /** After the intercooler (or the intake-air sensor of an engine without one). */
  chargeTempK?: Float32Array
  /** Before the intercooler (compressor outlet). */
  preCoolerTempK?: Float32Array
  ambientTempK?: Float32Array
  speedMps?: Float32Array
  massAirFlowKgPerS?: Float32Array
  humidityPct?: Float32Array
  /** Calculated engine load as the engine computer reports it (OBD), %. */
  engineLoadPct?: Float32Array
}

export type ValueFieldName = Exclude<keyof LogChannels, 'timeS'>

// Plausibility limits are deliberately wide: they only reject values no sensor of that kind can
// report (common practice, no source). Anything inside is kept and judged by the masks.
const SPECS: Readonly<Record<ValueChannelId, Omit<ChannelSpec, 'siUnit'>>> = {
  rpm: { id: 'rpm', field: 'rpm', quantity: 'rotationalSpeed', label: 'Engine speed', plausibleMin: 0, plausibleMax: 20000 },
  throttle: { id: 'throttle', field: 'throttlePct', quantity: 'percent', label: 'Throttle', plausibleMin: -5, plausibleMax: 105 },
  pedal: { id: 'pedal', field: 'pedalPct', quantity: 'percent', label: 'Accelerator pedal', plausibleMin: -5, plausibleMax: 105 },
  manifoldPressure: { id: 'manifoldPressure', field: 'manifoldPressurePa', quantity: 'pressure', label: 'Boost', detail: 'absolute, manifold pressure', plausibleMin: 5000, plausibleMax: 600000 },
  boost: { id: 'boost', field: 'boostPa', quantity: 'pressure', label: 'Boost', detail: 'gauge, above barometric pressure', plausibleMin: -101325, plausibleMax: 500000 },
  baro: { id: 'baro', field: 'baroPa', quantity: 'pressure', label: 'Barometric pressure', plausibleMin: 40000, plausibleMax: 115000 },
  chargeTemp: { id: 'chargeTemp', field: 'chargeTempK', quantity: 'temperature', label: 'Charge temperature', detail: 'after the intercooler', plausibleMin: 203.15, plausibleMax: 523.15 },
  preCoolerTemp: { id: 'preCoolerTemp', field: 'preCoolerTempK', quantity: 'temperature', label: 'Pre-cooler temperature', detail: 'before the intercooler', plausibleMin: 203.15, plausibleMax: 573.15 },
  ambientTemp: { id: 'ambientTemp', field: 'ambientTempK', quantity: 'temperature', label: 'Ambient temperature', plausibleMin: 213.15, plausibleMax: 343.15 },
  speed: { id: 'speed', field: 'speedMps', quantity: 'speed', label: 'Road speed', plausibleMin: 0, plausibleMax: 150 },
  massAirFlow: { id: 'massAirFlow', field: 'massAirFlowKgPerS', quantity: 'massFlow', label: 'Air mass flow', plausibleMin: 0, plausibleMax: 5 },
  humidity: { id: 'humidity', field: 'humidityPct', quantity: 'percent', label: 'Relative humidity', plausibleMin: 0, plausibleMax: 100 },
  engineLoad: { id: 'engineLoad', field: 'engineLoadPct', quantity: 'percent', label: 'Calculated engine load', plausibleMin: -5, plausibleMax: 105 },
}

export const CHANNELS = Object.fromEntries(Object.entries(SPECS).map(([id, spec]) => [id, { ...spec, siUnit: SI_UNIT[spec.quantity] }])) as Readonly<Record<ValueChannelId, ChannelSpec>>

export const VALUE_CHANNEL_IDS = CHANNEL_IDS.filter((id): id is ValueChannelId => id !== 'time')

export function isChannelId(text: string): text is ChannelId {
  return (CHANNEL_IDS as readonly string[]).includes(text)
}

/** The samples of one channel, or undefined when the log does not have it. */
export function channelData(channels: LogChannels, id: ChannelId): Float64Array | Float32Array | undefined {
  return id === 'time' ? channels.timeS : channels[CHANNELS[id].field]
}

/** Units a mapping may name for a channel: a time format, or any unit of the channel's quantity. */
export function allowedUnits(id: ChannelId): readonly string[] {
  if (id === 'time') return TIME_FORMATS
  return UNITS[CHANNELS[id].quantity]
}

/** How a unit of the column form reads on screen: "degC" → "°C", "ms" (time) → "milliseconds". */
export function mappingUnitLabel(id: ChannelId, unit: string): string {
  if (id === 'time') return TIME_FORMAT_WORDS[unit as TimeFormat] ?? unit
  return unitSymbol(unit as Unit)
}

export interface MappableChannel {
  readonly id: ChannelId
  readonly label: string
  /** Units offered, the first the default (`allowedUnits`). */
  readonly units: readonly string[]
  /** A log cannot be analysed without it. */
  readonly needed?: boolean
}

// The column form's order: the order a person thinks of them, not the engine's.
const FORM_ORDER: readonly ChannelId[] = [
  'time', 'chargeTemp', 'preCoolerTemp', 'ambientTemp', 'manifoldPressure', 'boost', 'baro',
  'rpm', 'pedal', 'throttle', 'speed', 'massAirFlow', 'humidity', 'engineLoad',
]
const NEEDED: ReadonlySet<ChannelId> = new Set(['time', 'chargeTemp'])

/** Every channel as the column form offers it, derived from the catalogue above. */
export const MAPPABLE_CHANNELS: readonly MappableChannel[] = FORM_ORDER.map((id) => {
  const spec = id === 'time' ? { label: 'Time', detail: undefined } : CHANNELS[id]
  return {
    id,
    label: spec.detail ? `${spec.label} (${spec.detail})` : spec.label,
    units: allowedUnits(id),
    ...(NEEDED.has(id) ? { needed: true } : {}),
  }
})
