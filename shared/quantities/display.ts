// Display units: the units a person may read results in, chosen once in the units store (saved
// with their profile) and applied at the edge. One list for the store, the unit switcher, the
// account page, the profile route's validation and every formatter; the numbers come from the
// unit catalogue (./units), so a value shown in psi or hp uses the very factor the engine imports
// logger columns with.
import { conversionBetween, convertDifference, unitSymbol, type Conversion, type Unit } from './units'

export interface DisplayUnitSpec {
  /** What the profile stores and the API takes (`preferences.temperature: 'F'`). */
  readonly id: string
  /** The unit in the catalogue. */
  readonly unit: Unit
  /** Decimals to add to a formatter's usual count (1 bar = 100 kPa: one more keeps the resolution). */
  readonly extraDigits?: number
}

/** Per quantity, the choices in the order offered; the first is the default. */
export const DISPLAY_UNITS = {
  temperature: [{ id: 'C', unit: 'degC' }, { id: 'F', unit: 'degF' }],
  pressure: [{ id: 'kPa', unit: 'kPa' }, { id: 'bar', unit: 'bar', extraDigits: 1 }, { id: 'psi', unit: 'psi' }],
  power: [{ id: 'kW', unit: 'kW' }, { id: 'hp', unit: 'hp' }, { id: 'PS', unit: 'PS' }],
} as const satisfies Record<string, readonly [DisplayUnitSpec, ...DisplayUnitSpec[]]>

export type DisplayQuantity = keyof typeof DISPLAY_UNITS
export type DisplayUnit<Q extends DisplayQuantity = DisplayQuantity> = typeof DISPLAY_UNITS[Q][number]['id']
export type DisplayTemperatureUnit = DisplayUnit<'temperature'>
export type DisplayPressureUnit = DisplayUnit<'pressure'>
export type DisplayPowerUnit = DisplayUnit<'power'>
export type DisplayUnits = { [Q in DisplayQuantity]: DisplayUnit<Q> }

export const DISPLAY_QUANTITIES = Object.keys(DISPLAY_UNITS) as DisplayQuantity[]

/** The quantity in plain words, as a field label ("Temperature"; lower-cased inside a sentence). */
export const DISPLAY_QUANTITY_LABELS: Record<DisplayQuantity, string> = {
  temperature: 'Temperature',
  pressure: 'Pressure',
  power: 'Power',
}

/**
 * The unit a value arrives in from the API (°C, kPa, kW: what the analysis results carry for
 * people); temperature differences arrive in K.
 */
export const DISPLAY_BASE: { readonly [Q in DisplayQuantity]: Unit } = { temperature: 'degC', pressure: 'kPa', power: 'kW' }

function unknownDisplayUnit(quantity: DisplayQuantity, id: unknown): never {
  throw new RangeError(`Unknown ${quantity} display unit "${String(id)}"; expected one of ${displayUnitIds(quantity).join(', ')}`)
}

function specOf<Q extends DisplayQuantity>(quantity: Q, id: DisplayUnit<Q>): DisplayUnitSpec {
  return (DISPLAY_UNITS[quantity] as readonly DisplayUnitSpec[]).find(u => u.id === id) ?? unknownDisplayUnit(quantity, id)
}

/** The ids offered for a quantity, as a non-empty list (for zod enums and selects). */
export function displayUnitIds<Q extends DisplayQuantity>(quantity: Q): readonly [DisplayUnit<Q>, ...DisplayUnit<Q>[]] {
  return DISPLAY_UNITS[quantity].map(u => u.id) as unknown as readonly [DisplayUnit<Q>, ...DisplayUnit<Q>[]]
}

export const DEFAULT_DISPLAY_UNITS: DisplayUnits = {
  temperature: DISPLAY_UNITS.temperature[0].id,
  pressure: DISPLAY_UNITS.pressure[0].id,
  power: DISPLAY_UNITS.power[0].id,
}

export function isDisplayUnit<Q extends DisplayQuantity>(quantity: Q, text: unknown): text is DisplayUnit<Q> {
  return (DISPLAY_UNITS[quantity] as readonly DisplayUnitSpec[]).some(u => u.id === text)
}

/** A saved preference if it is still offered, else the default (a profile may hold an old value). */
export function displayUnitOr<Q extends DisplayQuantity>(quantity: Q, text: unknown): DisplayUnit<Q> {
  return isDisplayUnit(quantity, text) ? text : DEFAULT_DISPLAY_UNITS[quantity]
}

/** The catalogue unit behind a choice: "F" → "degF". */
export function displayUnitOf<Q extends DisplayQuantity>(quantity: Q, id: DisplayUnit<Q>): Unit {
  return specOf(quantity, id).unit
}

/** How the choice reads on screen: "C" → "°C", "psi" → "psi". */
export function displaySymbol<Q extends DisplayQuantity>(quantity: Q, id: DisplayUnit<Q>): string {
  return unitSymbol(specOf(quantity, id).unit)
}

/** The choices a quantity offers, in words, for a message: "C (°C) or F (°F)", "kPa, bar or psi". */
export function displayChoicesText(quantity: DisplayQuantity): string {
  const words = DISPLAY_UNITS[quantity].map(u => (unitSymbol(u.unit) === u.id ? u.id : `${u.id} (${unitSymbol(u.unit)})`))
  return words.length > 1 ? `${words.slice(0, -1).join(', ')} or ${words.at(-1)}` : words.join('')
}

export function displayExtraDigits<Q extends DisplayQuantity>(quantity: Q, id: DisplayUnit<Q>): number {
  return specOf(quantity, id).extraDigits ?? 0
}

// One affine pair per choice, from the unit values arrive in (DISPLAY_BASE) to the choice.
const FROM_BASE = new Map<string, Conversion>()
for (const quantity of DISPLAY_QUANTITIES) {
  for (const spec of DISPLAY_UNITS[quantity] as readonly DisplayUnitSpec[]) {
    FROM_BASE.set(`${quantity}:${spec.id}`, conversionBetween(DISPLAY_BASE[quantity], spec.unit))
  }
}

/** The affine pair from the arriving unit (°C, kPa, kW) to the chosen one: shown = value · scale + offset. */
export function displayConversion<Q extends DisplayQuantity>(quantity: Q, id: DisplayUnit<Q>): Conversion {
  return FROM_BASE.get(`${quantity}:${id}`) ?? unknownDisplayUnit(quantity, id)
}

/** A value as it arrives (°C, kPa, kW) in the chosen display unit. */
export function toDisplay<Q extends DisplayQuantity>(value: number, quantity: Q, id: DisplayUnit<Q>): number {
  const { scale, offset } = displayConversion(quantity, id)
  return value * scale + offset
}

/** A value typed in the chosen display unit back to the unit the API takes (°C, kPa, kW). */
export function fromDisplay<Q extends DisplayQuantity>(value: number, quantity: Q, id: DisplayUnit<Q>): number {
  const { scale, offset } = displayConversion(quantity, id)
  return (value - offset) / scale
}

/** A temperature difference in K in the chosen unit (1 K = 1 °C = 1.8 °F of difference). */
export function temperatureDifferenceToDisplay(valueK: number, id: DisplayTemperatureUnit): number {
  return convertDifference(valueK, 'K', specOf('temperature', id).unit)
}

/** How a temperature difference reads: K beside °C (the glossary's "temperature over ambient, in K"), °F beside °F. */
export function temperatureDifferenceSymbol(id: DisplayTemperatureUnit): string {
  const unit = specOf('temperature', id).unit
  return unit === 'degC' ? 'K' : unitSymbol(unit)
}
