// Display formatting at the edge. Values arrive as the API sends them to people (°C for
// temperatures, kPa for pressures, kW for power); the display units and their exact conversions
// are the unit catalogue's (shared/quantities/display.ts), the same factors the engine imports with.
import { displayExtraDigits, displaySymbol, toDisplay, type DisplayPowerUnit, type DisplayPressureUnit, type DisplayTemperatureUnit } from '../quantities/display'

/**
 * A figure with a fixed number of decimals and the typographic minus (−5.0, not -5.0), as every
 * figure on screen is printed; a value that rounds to zero shows no sign. Screens only: CSV
 * exports and form inputs keep the plain hyphen-minus a spreadsheet or a number field reads.
 */
export function formatFixed(value: number, digits = 1): string {
  const text = value.toFixed(digits)
  return /^-0?\.?0*$/.test(text) ? text.slice(1) : text.replace(/^-/, '−')
}

export function formatTemperature(valueC: number | null | undefined, unit: DisplayTemperatureUnit = 'C', digits = 1) {
  if (valueC == null || !Number.isFinite(valueC)) return '—'
  return `${formatFixed(toDisplay(valueC, 'temperature', unit), digits)} ${displaySymbol('temperature', unit)}`
}

export function formatPressure(valueKpa: number | null | undefined, unit: DisplayPressureUnit = 'kPa', digits = 1) {
  if (valueKpa == null || !Number.isFinite(valueKpa)) return '—'
  return `${formatFixed(toDisplay(valueKpa, 'pressure', unit), digits + displayExtraDigits('pressure', unit))} ${displaySymbol('pressure', unit)}`
}

export function formatPower(valueKw: number | null | undefined, unit: DisplayPowerUnit = 'kW', digits = 0) {
  if (valueKw == null || !Number.isFinite(valueKw)) return '—'
  return `${formatFixed(toDisplay(valueKw, 'power', unit), digits)} ${displaySymbol('power', unit)}`
}

export function formatMoney(cents: number | null | undefined, currency: string) {
  if (cents == null) return '—'
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency }).format(cents / 100)
}

export function formatDate(value: string | number | Date | null | undefined) {
  if (value == null) return '—'
  return new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium' }).format(new Date(value))
}
