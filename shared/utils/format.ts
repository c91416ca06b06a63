// Display formatting at the edge. Values arrive in SI (°C for temperatures shown to people,
// kPa for pressures, kW for power); the conversions are exact definitions (see physics notes).

export function formatTemperature(valueC: number | null | undefined, unit: 'C' | 'F' = 'C', digits = 1) {
  if (valueC == null || !Number.isFinite(valueC)) return '—'
  return unit === 'F' ? `${(valueC * 9 / 5 + 32).toFixed(digits)} °F` : `${valueC.toFixed(digits)} °C`
}

// 1 psi = 6.894757293168361 kPa (exact from the pound and inch definitions).
export function formatPressure(valueKpa: number | null | undefined, unit: 'kPa' | 'bar' | 'psi' = 'kPa', digits = 1) {
  if (valueKpa == null || !Number.isFinite(valueKpa)) return '—'
  if (unit === 'bar') return `${(valueKpa / 100).toFixed(digits + 1)} bar`
  if (unit === 'psi') return `${(valueKpa / 6.894757293168361).toFixed(digits)} psi`
  return `${valueKpa.toFixed(digits)} kPa`
}

// 1 hp (mechanical) = 745.69987158227 W; 1 PS = 735.49875 W.
export function formatPower(valueKw: number | null | undefined, unit: 'kW' | 'hp' | 'PS' = 'kW', digits = 0) {
  if (valueKw == null || !Number.isFinite(valueKw)) return '—'
  if (unit === 'hp') return `${(valueKw * 1000 / 745.69987158227).toFixed(digits)} hp`
  if (unit === 'PS') return `${(valueKw * 1000 / 735.49875).toFixed(digits)} PS`
  return `${valueKw.toFixed(digits)} kW`
}

export function formatMoney(cents: number | null | undefined, currency: string) {
  if (cents == null) return '—'
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency }).format(cents / 100)
}

export function formatDate(value: string | number | Date | null | undefined) {
  if (value == null) return '—'
  return new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium' }).format(new Date(value))
}
