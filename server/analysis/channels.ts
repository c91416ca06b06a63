// Canonical channels: the vocabulary every logger column is mapped onto. The channel id (left) is
// what mapping JSON, profiles and the series API use; the `LogChannels` field (right) carries the
// SI unit in its name, because that is what the arrays hold once imported.
import type { Quantity, Unit } from './units'

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

export interface ChannelSpec {
  readonly id: ValueChannelId
  /** Field of `LogChannels` holding the converted samples. */
  readonly field: ValueFieldName
  readonly quantity: Quantity
  /** Unit of the stored samples (SI except %, rpm). */
  readonly siUnit: string
  readonly label: string
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
export const CHANNELS: Readonly<Record<ValueChannelId, ChannelSpec>> = {
  rpm: { id: 'rpm', field: 'rpm', quantity: 'rotationalSpeed', siUnit: 'rpm', label: 'Engine speed', plausibleMin: 0, plausibleMax: 20000 },
  throttle: { id: 'throttle', field: 'throttlePct', quantity: 'percent', siUnit: '%', label: 'Throttle', plausibleMin: -5, plausibleMax: 105 },
  pedal: { id: 'pedal', field: 'pedalPct', quantity: 'percent', siUnit: '%', label: 'Accelerator pedal', plausibleMin: -5, plausibleMax: 105 },
  manifoldPressure: { id: 'manifoldPressure', field: 'manifoldPressurePa', quantity: 'pressure', siUnit: 'Pa', label: 'Manifold pressure (absolute)', plausibleMin: 5000, plausibleMax: 600000 },
  boost: { id: 'boost', field: 'boostPa', quantity: 'pressure', siUnit: 'Pa', label: 'Boost (gauge)', plausibleMin: -101325, plausibleMax: 500000 },
  baro: { id: 'baro', field: 'baroPa', quantity: 'pressure', siUnit: 'Pa', label: 'Barometric pressure', plausibleMin: 40000, plausibleMax: 115000 },
  chargeTemp: { id: 'chargeTemp', field: 'chargeTempK', quantity: 'temperature', siUnit: 'K', label: 'Charge air temperature', plausibleMin: 203.15, plausibleMax: 523.15 },
  preCoolerTemp: { id: 'preCoolerTemp', field: 'preCoolerTempK', quantity: 'temperature', siUnit: 'K', label: 'Pre-cooler temperature', plausibleMin: 203.15, plausibleMax: 573.15 },
  ambientTemp: { id: 'ambientTemp', field: 'ambientTempK', quantity: 'temperature', siUnit: 'K', label: 'Ambient temperature', plausibleMin: 213.15, plausibleMax: 343.15 },
  speed: { id: 'speed', field: 'speedMps', quantity: 'speed', siUnit: 'm/s', label: 'Road speed', plausibleMin: 0, plausibleMax: 150 },
  massAirFlow: { id: 'massAirFlow', field: 'massAirFlowKgPerS', quantity: 'massFlow', siUnit: 'kg/s', label: 'Air mass flow', plausibleMin: 0, plausibleMax: 5 },
  humidity: { id: 'humidity', field: 'humidityPct', quantity: 'percent', siUnit: '%', label: 'Relative humidity', plausibleMin: 0, plausibleMax: 100 },
  engineLoad: { id: 'engineLoad', field: 'engineLoadPct', quantity: 'percent', siUnit: '%', label: 'Calculated engine load', plausibleMin: -5, plausibleMax: 105 },
}

export const VALUE_CHANNEL_IDS = CHANNEL_IDS.filter((id): id is ValueChannelId => id !== 'time')

export function isChannelId(text: string): text is ChannelId {
  return (CHANNEL_IDS as readonly string[]).includes(text)
}

/** The samples of one channel, or undefined when the log does not have it. */
export function channelData(channels: LogChannels, id: ChannelId): Float64Array | Float32Array | undefined {
  return id === 'time' ? channels.timeS : channels[CHANNELS[id].field]
}

/** Units a mapping may name for a channel (the vocabulary of issue 3's mapping JSON). */
export function allowedUnits(id: ChannelId): readonly string[] {
  if (id === 'time') return TIME_FORMATS
  return MAPPING_UNITS[CHANNELS[id].quantity]
}

const MAPPING_UNITS: Record<Quantity, readonly Unit[]> = {
  temperature: ['degC', 'degF', 'K'],
  pressure: ['kPa', 'hPa', 'mbar', 'bar', 'psi', 'inHg', 'Pa'],
  speed: ['km/h', 'mph', 'm/s'],
  massFlow: ['g/s', 'kg/h', 'lb/min', 'kg/s'],
  power: ['kW'],
  time: ['s', 'ms'],
  percent: ['%'],
  rotationalSpeed: ['rpm'],
}
