// The core catalogue's vocabulary and limits, shared by the form (a friendly early check) and the
// API (the authoritative one). The bounds are sanity limits for a car's charge-air cooler, common
// practice, no source: they only reject a typo (a depth in centimetres, a width in metres), not a
// real but unusual core.

export const CORE_KINDS = ['stock', 'front-mount', 'top-mount', 'air-to-water'] as const
export const CORE_CONSTRUCTIONS = ['bar-and-plate', 'tube-and-fin'] as const
export const FIN_DENSITY_UNITS = ['per-inch', 'per-10cm'] as const
export const END_TANK_LAYOUTS = ['same-side', 'opposite-sides'] as const

export type CoreKind = typeof CORE_KINDS[number]
export type CoreConstruction = typeof CORE_CONSTRUCTIONS[number]
export type FinDensityUnit = typeof FIN_DENSITY_UNITS[number]
export type EndTankLayout = typeof END_TANK_LAYOUTS[number]

export const CORE_KIND_LABELS: Record<CoreKind, string> = {
  'stock': 'Factory core',
  'front-mount': 'Front-mount',
  'top-mount': 'Top-mount',
  'air-to-water': 'Air-to-water',
}
export const CORE_CONSTRUCTION_LABELS: Record<CoreConstruction, string> = {
  'bar-and-plate': 'Bar-and-plate',
  'tube-and-fin': 'Tube-and-fin',
}
export const FIN_DENSITY_UNIT_LABELS: Record<FinDensityUnit, string> = {
  'per-inch': 'fins per inch',
  'per-10cm': 'fins per 10 cm',
}
export const END_TANK_LAYOUT_LABELS: Record<EndTankLayout, string> = {
  'same-side': 'Inlet and outlet on the same side',
  'opposite-sides': 'Inlet and outlet on opposite sides',
}

export interface Bound { min: number, max: number, unit: string, label: string }

export const CORE_BOUNDS = {
  faceWidthMm: { min: 100, max: 1200, unit: 'mm', label: 'Face width' },
  faceHeightMm: { min: 50, max: 600, unit: 'mm', label: 'Face height' },
  depthMm: { min: 20, max: 150, unit: 'mm', label: 'Core depth' },
  inletDiameterMm: { min: 25, max: 120, unit: 'mm', label: 'Inlet diameter' },
  outletDiameterMm: { min: 25, max: 120, unit: 'mm', label: 'Outlet diameter' },
  weightKg: { min: 0.2, max: 60, unit: 'kg', label: 'Weight' },
  uaWPerK: { min: 10, max: 5000, unit: 'W/K', label: 'Heat conductance (UA)' },
} as const satisfies Record<string, Bound>

// 10 cm = 3.937 in, so the per-10 cm range is the per-inch range × 3.937.
export const FIN_DENSITY_BOUNDS: Record<FinDensityUnit, Bound> = {
  'per-inch': { min: 4, max: 40, unit: 'fins per inch', label: 'Fin density' },
  'per-10cm': { min: 16, max: 160, unit: 'fins per 10 cm', label: 'Fin density' },
}

/** Highest price a core may carry, in the currency's major unit. */
export const MAX_CORE_PRICE = 100_000

export const CORE_SORT_KEYS = ['name', 'kind', 'faceArea', 'depth', 'price', 'updated'] as const
export type CoreSortKey = typeof CORE_SORT_KEYS[number]
export const CORE_PAGE_SIZES = [10, 25, 50, 100] as const

/**
 * A money amount typed in the currency's major unit ("640", "640.5", "1 240,00" is refused) to
 * integer minor units. Returns a message when the text is not a plain amount with at most two
 * decimals: a price never carries a fraction of a cent.
 */
export function parseMoneyToCents(text: string): { cents: number } | { error: string } {
  const trimmed = text.trim()
  if (!/^\d+(\.\d+)?$/.test(trimmed)) return { error: 'enter an amount like 640 or 640.50 (digits and one decimal point)' }
  const [, decimals = ''] = trimmed.split('.')
  if (decimals.length > 2) return { error: 'an amount has at most two decimals (whole cents)' }
  const [whole = '0'] = trimmed.split('.')
  const cents = Number(whole) * 100 + Number(decimals.padEnd(2, '0'))
  if (cents > MAX_CORE_PRICE * 100) return { error: `an amount is at most ${MAX_CORE_PRICE.toLocaleString('en-GB')}` }
  return { cents }
}

/** Integer minor units back to the text the form shows ("640.50"). */
export function centsToMoneyText(cents: number | null | undefined): string {
  if (cents == null) return ''
  return (cents / 100).toFixed(2)
}

export function faceAreaM2(core: { faceWidthMm: number, faceHeightMm: number }): number {
  return core.faceWidthMm * core.faceHeightMm / 1e6
}
