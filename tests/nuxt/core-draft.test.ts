import { describe, expect, it } from 'vitest'
import { CORE_BOUNDS, FIN_DENSITY_BOUNDS } from '#shared/utils/cores'
import { changedFields, draftFromCore, draftToBody, emptyCoreDraft, type CoreDraft } from '~/utils/coreDraft'

// The core form's own check, run before anything is sent (the API checks again).
const draft = (over: Partial<CoreDraft> = {}): CoreDraft => ({
  ...emptyCoreDraft(),
  name: 'Bar-and-plate 600',
  faceWidthMm: 600,
  faceHeightMm: 300,
  depthMm: 76,
  price: '640.50',
  ...over,
})

describe('the core form', () => {
  it('turns a good draft into the API body with the price in cents', () => {
    const checked = draftToBody(draft({ finDensity: 16, cost: '385' }))
    expect(checked.errors).toBeNull()
    expect(checked.body).toMatchObject({ priceCents: 64_050, costCents: 38_500, finDensity: 16, finDensityUnit: 'per-inch', weightKg: null })
  })

  it.each([
    ['a negative depth', { depthMm: -76 }, 'depthMm', `Between ${CORE_BOUNDS.depthMm.min} and ${CORE_BOUNDS.depthMm.max} mm.`],
    ['a width in metres', { faceWidthMm: 0.6 }, 'faceWidthMm', 'Between 100 and 1200 mm.'],
    ['a fractional millimetre', { faceHeightMm: 300.5 }, 'faceHeightMm', 'A whole number of millimetres.'],
    ['no depth', { depthMm: null }, 'depthMm', 'Enter the core depth in mm.'],
    ['a third decimal on the price', { price: '640.505' }, 'price', 'An amount has at most two decimals (whole cents).'],
    ['fins per 10 cm typed as per inch', { finDensity: 60, finDensityUnit: 'per-inch' as const }, 'finDensity', `Between ${FIN_DENSITY_BOUNDS['per-inch'].min} and ${FIN_DENSITY_BOUNDS['per-inch'].max} fins per inch.`],
    ['a one-letter name', { name: 'X' }, 'name', 'Give the core a name of at least 2 characters.'],
  ])('says what is wrong with %s', (_what, over, field, message) => {
    const checked = draftToBody(draft(over))
    expect(checked.body).toBeNull()
    expect(checked.errors?.[field as keyof CoreDraft]).toBe(message)
  })

  it('sends only the fields that changed', () => {
    const before = draftToBody(draft())
    const after = draftToBody(draft({ depthMm: 90, notes: '  deeper  ' }))
    expect(changedFields(before.body!, after.body!)).toEqual({ depthMm: 90, notes: 'deeper' })
  })

  it('reads a stored core back into the form', () => {
    const form = draftFromCore({ id: 1, workshopId: 1, name: 'A', kind: 'stock', faceWidthMm: 300, faceHeightMm: 180, depthMm: 60, construction: null, finDensity: null, finDensityUnit: null, inletDiameterMm: null, outletDiameterMm: null, endTankLayout: null, weightKg: null, uaWPerK: null, costCents: 1, priceCents: 64_050, notes: '', retiredAt: null, createdAt: '', updatedAt: null, retired: false })
    expect(form).toMatchObject({ price: '640.50', cost: '0.01', finDensityUnit: 'per-inch' })
  })
})
