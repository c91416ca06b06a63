import type { CoreView } from '#shared/types/cores'
import {
  CORE_BOUNDS,
  FIN_DENSITY_BOUNDS,
  centsToMoneyText,
  parseMoneyToCents,
  type CoreConstruction,
  type CoreKind,
  type EndTankLayout,
  type FinDensityUnit,
} from '#shared/utils/cores'

// What the core form edits: numbers as typed (null when empty), money as text in the currency's
// major unit. `draftToBody` turns it into the API body and says what is wrong, field by field.
export interface CoreDraft {
  name: string
  kind: CoreKind
  construction: CoreConstruction | null
  faceWidthMm: number | null
  faceHeightMm: number | null
  depthMm: number | null
  finDensity: number | null
  finDensityUnit: FinDensityUnit
  inletDiameterMm: number | null
  outletDiameterMm: number | null
  endTankLayout: EndTankLayout | null
  weightKg: number | null
  uaWPerK: number | null
  cost: string
  price: string
  notes: string
}

export interface CoreBody {
  name: string
  kind: CoreKind
  construction: CoreConstruction | null
  faceWidthMm: number
  faceHeightMm: number
  depthMm: number
  finDensity: number | null
  finDensityUnit: FinDensityUnit | null
  inletDiameterMm: number | null
  outletDiameterMm: number | null
  endTankLayout: EndTankLayout | null
  weightKg: number | null
  uaWPerK: number | null
  costCents: number | null
  priceCents: number | null
  notes: string
}

export function emptyCoreDraft(): CoreDraft {
  return {
    name: '', kind: 'front-mount', construction: 'bar-and-plate', faceWidthMm: null, faceHeightMm: null, depthMm: null,
    finDensity: null, finDensityUnit: 'per-inch', inletDiameterMm: null, outletDiameterMm: null, endTankLayout: null,
    weightKg: null, uaWPerK: null, cost: '', price: '', notes: '',
  }
}

export function draftFromCore(core: CoreView): CoreDraft {
  return {
    name: core.name, kind: core.kind, construction: core.construction, faceWidthMm: core.faceWidthMm, faceHeightMm: core.faceHeightMm,
    depthMm: core.depthMm, finDensity: core.finDensity, finDensityUnit: core.finDensityUnit ?? 'per-inch', inletDiameterMm: core.inletDiameterMm,
    outletDiameterMm: core.outletDiameterMm, endTankLayout: core.endTankLayout, weightKg: core.weightKg, uaWPerK: core.uaWPerK,
    cost: centsToMoneyText(core.costCents), price: centsToMoneyText(core.priceCents), notes: core.notes,
  }
}

type Errors = Partial<Record<keyof CoreDraft, string>>

// An empty number input gives '' (or null); both mean "not known".
const blank = (value: unknown) => value === null || value === undefined || value === ''

function checkRange(errors: Errors, key: keyof CoreDraft & keyof typeof CORE_BOUNDS, value: number | null, required: boolean) {
  const bound = CORE_BOUNDS[key]
  if (blank(value)) {
    if (required) errors[key] = `Enter the ${bound.label.toLowerCase()} in ${bound.unit}.`
    return
  }
  if (!Number.isFinite(value) || value! < bound.min || value! > bound.max) errors[key] = `Between ${bound.min} and ${bound.max} ${bound.unit}.`
}

export function draftToBody(draft: CoreDraft): { body: CoreBody, errors: null } | { body: null, errors: Errors } {
  const errors: Errors = {}
  if (draft.name.trim().length < 2) errors.name = 'Give the core a name of at least 2 characters.'
  checkRange(errors, 'faceWidthMm', draft.faceWidthMm, true)
  checkRange(errors, 'faceHeightMm', draft.faceHeightMm, true)
  checkRange(errors, 'depthMm', draft.depthMm, true)
  checkRange(errors, 'inletDiameterMm', draft.inletDiameterMm, false)
  checkRange(errors, 'outletDiameterMm', draft.outletDiameterMm, false)
  checkRange(errors, 'weightKg', draft.weightKg, false)
  checkRange(errors, 'uaWPerK', draft.uaWPerK, false)
  for (const key of ['faceWidthMm', 'faceHeightMm', 'depthMm', 'inletDiameterMm', 'outletDiameterMm'] as const) {
    const value = draft[key]
    if (!errors[key] && !blank(value) && !Number.isInteger(value)) errors[key] = 'A whole number of millimetres.'
  }
  if (!blank(draft.finDensity)) {
    const bound = FIN_DENSITY_BOUNDS[draft.finDensityUnit]
    if (draft.finDensity! < bound.min || draft.finDensity! > bound.max) errors.finDensity = `Between ${bound.min} and ${bound.max} ${bound.unit}.`
  }
  const money = (text: string, key: 'cost' | 'price') => {
    if (!text.trim()) return null
    const parsed = parseMoneyToCents(text)
    if ('error' in parsed) {
      errors[key] = `${parsed.error.charAt(0).toUpperCase()}${parsed.error.slice(1)}.`
      return null
    }
    return parsed.cents
  }
  const costCents = money(draft.cost, 'cost')
  const priceCents = money(draft.price, 'price')
  if (Object.keys(errors).length) return { body: null, errors }
  const orNull = (value: number | null) => (blank(value) ? null : value)
  return {
    errors: null,
    body: {
      name: draft.name.trim(),
      kind: draft.kind,
      construction: draft.construction,
      faceWidthMm: draft.faceWidthMm!,
      faceHeightMm: draft.faceHeightMm!,
      depthMm: draft.depthMm!,
      finDensity: orNull(draft.finDensity),
      finDensityUnit: blank(draft.finDensity) ? null : draft.finDensityUnit,
      inletDiameterMm: orNull(draft.inletDiameterMm),
      outletDiameterMm: orNull(draft.outletDiameterMm),
      endTankLayout: draft.endTankLayout,
      weightKg: orNull(draft.weightKg),
      uaWPerK: orNull(draft.uaWPerK),
      costCents,
      priceCents,
      notes: draft.notes.trim(),
    },
  }
}

/** Only the fields that changed, so an edit writes nothing it did not mean to. */
export function changedFields(before: CoreBody, after: CoreBody): Partial<CoreBody> {
  const changes: Partial<CoreBody> = {}
  for (const key of Object.keys(after) as Array<keyof CoreBody>) {
    if (after[key] !== before[key]) (changes as Record<string, unknown>)[key] = after[key]
  }
  return changes
}
