// One set of bounds for the conditions of a log (entered on the upload form, sent to the API,
// or given as a fixed value in a column mapping), so the form, the routes and the engine agree.
// The ranges are generous for where a car can be driven (common practice, no source):
// −40…60 °C ambient, −500…6000 m site altitude, 50…110 kPa barometric pressure.
import { fromSI } from '../quantities/units'

export interface ConditionBound {
  min: number
  max: number
  /** Unit as shown to a person. */
  unit: string
  /** Plain words for the quantity, as in a sentence. */
  label: string
}

export const CONDITION_BOUNDS = {
  ambientTempC: { min: -40, max: 60, unit: '°C', label: 'ambient temperature' },
  altitudeM: { min: -500, max: 6000, unit: 'm', label: 'site altitude' },
  baroKpa: { min: 50, max: 110, unit: 'kPa', label: 'barometric pressure' },
  humidityPct: { min: 0, max: 100, unit: '%', label: 'relative humidity' },
} as const satisfies Record<string, ConditionBound>

export type ConditionKey = keyof typeof CONDITION_BOUNDS

/**
 * Channels that a mapping may give as one fixed value instead of a column, with the condition
 * whose bounds apply and how to turn an SI value (K, Pa, %) into that condition's unit.
 */
export const FIXED_VALUE_BOUNDS = {
  ambientTemp: { condition: 'ambientTempC', fromSI: (kelvin: number) => fromSI(kelvin, 'degC') },
  baro: { condition: 'baroKpa', fromSI: (pascal: number) => fromSI(pascal, 'kPa') },
  humidity: { condition: 'humidityPct', fromSI: (percent: number) => percent },
} as const satisfies Record<string, { condition: ConditionKey, fromSI: (value: number) => number }>

export function conditionInBounds(key: ConditionKey, value: number): boolean {
  const bound = CONDITION_BOUNDS[key]
  return Number.isFinite(value) && value >= bound.min && value <= bound.max
}

/** "The barometric pressure must be between 50 and 110 kPa." */
export function conditionBoundMessage(key: ConditionKey): string {
  const bound = CONDITION_BOUNDS[key]
  // A typographic minus (−40), as printed everywhere else on screen.
  const n = (v: number) => String(v).replace('-', '−')
  return `The ${bound.label} must be between ${n(bound.min)} and ${n(bound.max)} ${bound.unit}`
}

// The day of the pulls: a real calendar day, not before 1990 (no engine logger wrote a file this
// tool can read before then) and at most a day ahead (time zones), never further in the future.
export const RECORDED_ON_EARLIEST = '1990-01-01'

export function recordedOnProblem(text: string, now = new Date()): string | null {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text)
  const plain = `Give the day of the pulls as a real date like 2026-07-14, between ${RECORDED_ON_EARLIEST} and tomorrow.`
  if (!match) return plain
  const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])]
  const date = new Date(Date.UTC(year, month - 1, day))
  if (date.getUTCFullYear() !== year || date.getUTCMonth() !== month - 1 || date.getUTCDate() !== day) return plain
  if (text < RECORDED_ON_EARLIEST) return plain
  const latest = new Date(now.getTime() + 86_400_000).toISOString().slice(0, 10)
  if (text > latest) return `The day of the pulls is in the future. ${plain}`
  return null
}
