// Numbers (not strings) in the person's display units, for charts and sliders. Conversions are
// exact definitions, the same as shared/utils/format.ts.
import type { PressureUnit, TemperatureUnit } from '~/stores/units'

const KELVIN_OFFSET = 273.15
const KPA_PER_PSI = 6.894757293168361

export function temperatureIn(valueC: number, unit: TemperatureUnit): number {
  return unit === 'F' ? valueC * 9 / 5 + 32 : valueC
}

export function temperatureFrom(value: number, unit: TemperatureUnit): number {
  return unit === 'F' ? (value - 32) * 5 / 9 : value
}

/** A temperature difference (K) in the display unit: 1 K = 1.8 °F of difference. */
export function temperatureDifferenceIn(valueK: number, unit: TemperatureUnit): number {
  return unit === 'F' ? valueK * 9 / 5 : valueK
}

export function pressureIn(valueKpa: number, unit: PressureUnit): number {
  if (unit === 'bar') return valueKpa / 100
  if (unit === 'psi') return valueKpa / KPA_PER_PSI
  return valueKpa
}

export const temperatureSymbol = (unit: TemperatureUnit) => (unit === 'F' ? '°F' : '°C')
export const temperatureDifferenceSymbol = (unit: TemperatureUnit) => (unit === 'F' ? '°F' : 'K')

export function formatTemperatureDifference(valueK: number | null | undefined, unit: TemperatureUnit, digits = 1): string {
  if (valueK == null || !Number.isFinite(valueK)) return '—'
  return `${temperatureDifferenceIn(valueK, unit).toFixed(digits)} ${temperatureDifferenceSymbol(unit)}`
}

/**
 * A series value as the API sends it (SI: K, Pa; or already °C / kPa) in display units.
 * The series endpoint names its unit, so the conversion follows the name, not the channel.
 */
export function seriesValueIn(value: number, seriesUnit: string, display: { temperature: TemperatureUnit, pressure: PressureUnit }): number {
  switch (seriesUnit) {
    case 'K': return temperatureIn(value - KELVIN_OFFSET, display.temperature)
    case 'degC':
    case '°C': return temperatureIn(value, display.temperature)
    case 'Pa': return pressureIn(value / 1000, display.pressure)
    case 'kPa': return pressureIn(value, display.pressure)
    default: return value
  }
}
