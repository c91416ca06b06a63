// The unit catalogue: every unit Densitas reads or shows, the quantity it measures, and its exact
// conversion to SI. One catalogue for the analysis engine (logger columns, user input), the server
// (validation) and the pages (display units, shared/quantities/display.ts). Plain TypeScript with
// relative imports only, so the engine, its worker bundle and the command-line scripts load it too.
//
// Every conversion is affine: si = value · scale + offset. Callers that convert a whole column
// (millions of samples) fetch the pair once with `conversionFor(unit)` and run one multiply-add
// per value; nothing here allocates per value.
//
// Factors are built from exact definitions (international pound 0.453 592 37 kg, inch 0.0254 m,
// standard gravity 9.806 65 m/s²), so they are exact to double precision. The unit tests cross-check
// them against mathjs `unit()` wherever mathjs knows the unit.

/** Standard acceleration of gravity, m/s² (exact by definition, 3rd CGPM 1901; ISO 2533:1975 Table 1). */
export const G0_M_S2 = 9.80665

/** °C ↔ K offset (exact by definition of the Celsius scale). */
export const KELVIN_OFFSET = 273.15

/** Units offered per physical quantity (for unit selectors and mapping validation). */
export const UNITS = {
  temperature: ['degC', 'degF', 'K'],
  pressure: ['kPa', 'hPa', 'mbar', 'bar', 'psi', 'inHg', 'Pa'],
  speed: ['km/h', 'mph', 'm/s'],
  massFlow: ['g/s', 'kg/h', 'lb/min', 'kg/s'],
  power: ['kW', 'W', 'hp', 'PS'],
  time: ['s', 'ms', 'min', 'h'],
  percent: ['%'],
  rotationalSpeed: ['rpm'],
} as const

export type Quantity = keyof typeof UNITS
export type TemperatureUnit = typeof UNITS.temperature[number]
export type PressureUnit = typeof UNITS.pressure[number]
export type SpeedUnit = typeof UNITS.speed[number]
export type MassFlowUnit = typeof UNITS.massFlow[number]
export type PowerUnit = typeof UNITS.power[number]
export type TimeUnit = typeof UNITS.time[number]
export type Unit = typeof UNITS[Quantity][number]

/** The unit every quantity is stored in inside the analysis (SI, except % and rpm kept as is). */
export const SI_UNIT: Readonly<Record<Quantity, Unit>> = {
  temperature: 'K',
  pressure: 'Pa',
  speed: 'm/s',
  massFlow: 'kg/s',
  power: 'W',
  time: 's',
  percent: '%',
  rotationalSpeed: 'rpm',
}

/** si = value · scale + offset */
export interface Conversion {
  readonly scale: number
  readonly offset: number
}

// Exact base definitions (NIST SP 811 appendix B; the international yard and pound agreement of 1959).
const POUND_KG = 0.45359237
const INCH_M = 0.0254
const FOOT_M = 0.3048
const MILE_M = 1609.344

/** 1 psi = 1 lbf/in² = 6 894.757 293 168 361 Pa, exact (reference sheet §10, scipy.constants.psi). */
export const PSI_PA = POUND_KG * G0_M_S2 / (INCH_M * INCH_M)

/**
 * Conventional inch of mercury: mercury density 13 595.1 kg/m³ under standard gravity,
 * 3 386.388 64 Pa (reference sheet §10, COMPUTED; NIST SP 811 lists 3.386 389 E+03, from memory).
 * The 60 °F variant (3 376.85 Pa) is not used.
 */
export const INHG_PA = 13595.1 * G0_M_S2 * INCH_M

/** Mechanical horsepower, 550 ft·lbf/s = 745.699 871 582 27 W (scipy.constants.hp). */
export const HP_W = 550 * FOOT_M * POUND_KG * G0_M_S2

/** Metric horsepower (PS), 75 kgf·m/s = 735.498 75 W, exact by definition. */
export const PS_W = 75 * G0_M_S2

/** 1 mile per hour in m/s (international mile 1 609.344 m). */
export const MPH_M_S = MILE_M / 3600

/** 1 lb/min in kg/s = 0.007 559 872 833 kg/s (reference sheet §10). */
export const LB_MIN_KG_S = POUND_KG / 60

const CONVERSIONS: Record<Unit, Conversion> = {
  'degC': { scale: 1, offset: KELVIN_OFFSET },
  // K = (°F + 459.67)·5/9 (exact; scipy.constants.convert_temperature).
  'degF': { scale: 5 / 9, offset: 459.67 * 5 / 9 },
  'K': { scale: 1, offset: 0 },
  'Pa': { scale: 1, offset: 0 },
  'kPa': { scale: 1000, offset: 0 },
  'hPa': { scale: 100, offset: 0 },
  'mbar': { scale: 100, offset: 0 },
  'bar': { scale: 100000, offset: 0 },
  'psi': { scale: PSI_PA, offset: 0 },
  'inHg': { scale: INHG_PA, offset: 0 },
  'm/s': { scale: 1, offset: 0 },
  'km/h': { scale: 1000 / 3600, offset: 0 },
  'mph': { scale: MPH_M_S, offset: 0 },
  'kg/s': { scale: 1, offset: 0 },
  'g/s': { scale: 0.001, offset: 0 },
  'kg/h': { scale: 1 / 3600, offset: 0 },
  'lb/min': { scale: LB_MIN_KG_S, offset: 0 },
  'W': { scale: 1, offset: 0 },
  'kW': { scale: 1000, offset: 0 },
  'hp': { scale: HP_W, offset: 0 },
  'PS': { scale: PS_W, offset: 0 },
  's': { scale: 1, offset: 0 },
  'ms': { scale: 0.001, offset: 0 },
  'min': { scale: 60, offset: 0 },
  'h': { scale: 3600, offset: 0 },
  '%': { scale: 1, offset: 0 },
  'rpm': { scale: 1, offset: 0 },
}

const QUANTITY_OF = new Map<string, Quantity>()
for (const quantity of Object.keys(UNITS) as Quantity[]) {
  for (const unit of UNITS[quantity]) QUANTITY_OF.set(unit, quantity)
}

export function isUnit(text: string): text is Unit {
  return QUANTITY_OF.has(text)
}

/** The quantity a unit measures. */
export function quantityOf(unit: Unit): Quantity {
  const quantity = QUANTITY_OF.get(unit)
  if (!quantity) throw new RangeError(`Unknown unit "${unit}"`)
  return quantity
}

/** The affine pair that takes a value in `unit` to SI: si = value · scale + offset. */
export function conversionFor(unit: Unit): Conversion {
  const conversion = CONVERSIONS[unit]
  if (!conversion) throw new RangeError(`Unknown unit "${String(unit)}"; expected one of ${[...QUANTITY_OF.keys()].join(', ')}`)
  return conversion
}

export function toSI(value: number, unit: Unit): number {
  const { scale, offset } = conversionFor(unit)
  return value * scale + offset
}

export function fromSI(valueSI: number, unit: Unit): number {
  const { scale, offset } = conversionFor(unit)
  return (valueSI - offset) / scale
}

function sameQuantity(from: Unit, to: Unit): void {
  if (quantityOf(from) !== quantityOf(to)) {
    throw new RangeError(`Cannot convert ${from} (${quantityOf(from)}) to ${to} (${quantityOf(to)})`)
  }
}

/** Convert between two units of the same quantity. */
export function convert(value: number, from: Unit, to: Unit): number {
  sameQuantity(from, to)
  return fromSI(toSI(value, from), to)
}

/**
 * The affine pair from one unit straight to another of the same quantity (to = value · scale +
 * offset), for converting many values (a chart's points) with one multiply-add each.
 */
export function conversionBetween(from: Unit, to: Unit): Conversion {
  sameQuantity(from, to)
  const a = conversionFor(from)
  const b = conversionFor(to)
  return { scale: a.scale / b.scale, offset: (a.offset - b.offset) / b.scale }
}

/** A *difference* between two units of one quantity: only the scales apply (1 K = 1 °C = 1.8 °F). */
export function convertDifference(delta: number, from: Unit, to: Unit): number {
  sameQuantity(from, to)
  return delta * conversionFor(from).scale / conversionFor(to).scale
}

// How a unit is written on screen where its code is not already the symbol.
const SYMBOLS: Partial<Record<Unit, string>> = { degC: '°C', degF: '°F' }

/** The unit as written on screen: "degC" → "°C", "kPa" → "kPa". */
export function unitSymbol(unit: Unit): string {
  return SYMBOLS[unit] ?? unit
}

/**
 * Convert a whole column to SI in place (one multiply-add per value). NaN (missing samples)
 * stays NaN. Returns the same array for chaining.
 */
export function toSIInPlace<T extends Float64Array | Float32Array | number[]>(column: T, unit: Unit): T {
  const { scale, offset } = conversionFor(unit)
  if (scale === 1 && offset === 0) return column
  for (let i = 0; i < column.length; i++) column[i] = column[i]! * scale + offset
  return column
}

/**
 * A temperature *difference* to kelvin: only the scale applies (1 K = 1 °C = 1.8 °F, exact).
 */
export function temperatureDifferenceToK(delta: number, unit: TemperatureUnit): number {
  return delta * conversionFor(unit).scale
}

export function celsiusToKelvin(tC: number): number {
  return tC + KELVIN_OFFSET
}

export function kelvinToCelsius(tK: number): number {
  return tK - KELVIN_OFFSET
}

// Spellings seen in logger headers, lower-cased, mapped to the canonical unit. Deliberately
// excludes gauge spellings such as "psig": gauge vs absolute is the importer's decision.
const ALIASES: Record<string, Unit> = {
  '°c': 'degC', 'ºc': 'degC', 'c': 'degC', 'degc': 'degC', 'deg c': 'degC', 'celsius': 'degC',
  '°f': 'degF', 'ºf': 'degF', 'f': 'degF', 'degf': 'degF', 'deg f': 'degF', 'fahrenheit': 'degF',
  'k': 'K', 'kelvin': 'K',
  'pa': 'Pa', 'kpa': 'kPa', 'hpa': 'hPa', 'mbar': 'mbar', 'bar': 'bar', 'psi': 'psi', 'psia': 'psi',
  'inhg': 'inHg', 'in hg': 'inHg', '"hg': 'inHg',
  'km/h': 'km/h', 'kmh': 'km/h', 'kph': 'km/h', 'mph': 'mph', 'm/s': 'm/s',
  'g/s': 'g/s', 'gps': 'g/s', 'kg/h': 'kg/h', 'kg/hr': 'kg/h', 'lb/min': 'lb/min', 'lbs/min': 'lb/min', 'kg/s': 'kg/s',
  'w': 'W', 'kw': 'kW', 'hp': 'hp', 'bhp': 'hp', 'ps': 'PS',
  's': 's', 'sec': 's', 'ms': 'ms', 'min': 'min', 'h': 'h',
  '%': '%', 'pct': '%',
  'rpm': 'rpm', '1/min': 'rpm', 'min-1': 'rpm', 'min^-1': 'rpm', 'u/min': 'rpm',
}

/** Canonical unit for a header spelling such as "°C", "kpa", "1/min"; undefined if unknown. */
export function parseUnit(text: string): Unit | undefined {
  const key = text.trim().toLowerCase()
  return isUnit(text.trim()) ? text.trim() as Unit : ALIASES[key]
}

/** Absolute pressure from gauge and barometric pressure (common practice, reference sheet §10). */
export function gaugeToAbsolutePa(gaugePa: number, baroPa: number): number {
  return gaugePa + baroPa
}
