// Numbers (not strings) in the person's display units, for charts and sliders. The units and
// their exact conversions are the unit catalogue's (shared/quantities), as in shared/utils/format.ts.
import {
  displaySymbol,
  displayUnitOf,
  fromDisplay,
  temperatureDifferenceSymbol,
  temperatureDifferenceToDisplay,
  toDisplay,
  type DisplayPressureUnit,
  type DisplayTemperatureUnit,
} from '#shared/quantities/display'
import { formatFixed } from '#shared/utils/format'
import { conversionBetween, parseUnit, quantityOf, type Conversion } from '#shared/quantities/units'

export { temperatureDifferenceSymbol }

export function temperatureIn(valueC: number, unit: DisplayTemperatureUnit): number {
  return toDisplay(valueC, 'temperature', unit)
}

export function temperatureFrom(value: number, unit: DisplayTemperatureUnit): number {
  return fromDisplay(value, 'temperature', unit)
}

/** A temperature difference (K) in the display unit: 1 K = 1.8 °F of difference. */
export function temperatureDifferenceIn(valueK: number, unit: DisplayTemperatureUnit): number {
  return temperatureDifferenceToDisplay(valueK, unit)
}

export function pressureIn(valueKpa: number, unit: DisplayPressureUnit): number {
  return toDisplay(valueKpa, 'pressure', unit)
}

export const temperatureSymbol = (unit: DisplayTemperatureUnit) => displaySymbol('temperature', unit)

export function formatTemperatureDifference(valueK: number | null | undefined, unit: DisplayTemperatureUnit, digits = 1): string {
  if (valueK == null || !Number.isFinite(valueK)) return '—'
  return `${formatFixed(temperatureDifferenceIn(valueK, unit), digits)} ${temperatureDifferenceSymbol(unit)}`
}

const IDENTITY: Conversion = { scale: 1, offset: 0 }

/**
 * How a series the API sends (in the unit it names: K, Pa, or already °C, kPa) reads in display
 * units, as one affine pair for all its points: shown = value · scale + offset. The conversion
 * follows the series' unit, not the channel; a unit that is neither a temperature nor a pressure
 * is shown as it is.
 */
export function seriesConversion(seriesUnit: string, display: { temperature: DisplayTemperatureUnit, pressure: DisplayPressureUnit }): Conversion {
  const unit = parseUnit(seriesUnit)
  if (!unit) return IDENTITY
  const quantity = quantityOf(unit)
  if (quantity === 'temperature') return conversionBetween(unit, displayUnitOf('temperature', display.temperature))
  if (quantity === 'pressure') return conversionBetween(unit, displayUnitOf('pressure', display.pressure))
  return IDENTITY
}
