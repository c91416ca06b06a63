// Plain-number wording of a comparison's figures (pure; the units store decides °C or °F).
import type { DisplayTemperatureUnit } from '#shared/quantities/display'
import { formatFixed } from '#shared/utils/format'
import { formatTemperatureDifference } from './displayUnits'

/** Effectiveness as a percentage: 0.683 → "68.3 %". */
export function formatEffectiveness(value: number | null | undefined, digits = 1): string {
  return value == null || !Number.isFinite(value) ? '—' : `${formatFixed(value * 100, digits)} %`
}

/** A change of effectiveness in percentage points, always signed: 0.18 → "+18.0 points". */
export function formatPoints(value: number | null | undefined, digits = 1): string {
  if (value == null || !Number.isFinite(value)) return '—'
  return `${value >= 0 ? '+' : '−'}${Math.abs(value * 100).toFixed(digits)} points`
}

/** A signed temperature change in the display unit: −18.1 → "−18.1 K". */
export function formatSignedDifference(valueK: number | null | undefined, unit: DisplayTemperatureUnit, digits = 1): string {
  if (valueK == null || !Number.isFinite(valueK)) return '—'
  return `${valueK > 0 ? '+' : ''}${formatTemperatureDifference(valueK, unit, digits)}`
}

/** "low to high" with a formatter, or a dash when there is no interval. */
export function formatInterval(interval: readonly [number, number] | null | undefined, format: (value: number) => string): string {
  return interval ? `${format(interval[0])} to ${format(interval[1])}` : 'no interval (too few pulls)'
}

export function formatSignedPct(value: number | null | undefined, digits = 1): string {
  if (value == null || !Number.isFinite(value)) return '—'
  return `${value >= 0 ? '+' : '−'}${Math.abs(value).toFixed(digits)} %`
}
