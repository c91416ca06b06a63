// Display formatting at the edge. Values arrive as the API sends them to people (°C for
// temperatures, kPa for pressures, kW for power); the display units and their exact conversions
// are the unit catalogue's (shared/quantities/display.ts), the same factors the engine imports with.
import { displayExtraDigits, displaySymbol, toDisplay, type DisplayPowerUnit, type DisplayPressureUnit, type DisplayTemperatureUnit } from '../quantities/display'

export function formatTemperature(valueC: number | null | undefined, unit: DisplayTemperatureUnit = 'C', digits = 1) {
  if (valueC == null || !Number.isFinite(valueC)) return '—'
  return `${toDisplay(valueC, 'temperature', unit).toFixed(digits)} ${displaySymbol('temperature', unit)}`
}

export function formatPressure(valueKpa: number | null | undefined, unit: DisplayPressureUnit = 'kPa', digits = 1) {
  if (valueKpa == null || !Number.isFinite(valueKpa)) return '—'
  return `${toDisplay(valueKpa, 'pressure', unit).toFixed(digits + displayExtraDigits('pressure', unit))} ${displaySymbol('pressure', unit)}`
}

export function formatPower(valueKw: number | null | undefined, unit: DisplayPowerUnit = 'kW', digits = 0) {
  if (valueKw == null || !Number.isFinite(valueKw)) return '—'
  return `${toDisplay(valueKw, 'power', unit).toFixed(digits)} ${displaySymbol('power', unit)}`
}

export function formatMoney(cents: number | null | undefined, currency: string) {
  if (cents == null) return '—'
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency }).format(cents / 100)
}

export function formatDate(value: string | number | Date | null | undefined) {
  if (value == null) return '—'
  return new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium' }).format(new Date(value))
}
