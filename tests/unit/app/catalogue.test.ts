import { describe, expect, it } from 'vitest'
import { CORE_BOUNDS, FIN_DENSITY_BOUNDS, centsToMoneyText, parseMoneyToCents } from '../../../shared/utils/cores'
import { changedFields, draftFromCore, draftToBody, emptyCoreDraft, type CoreDraft } from '../../../utils/coreDraft'
import { defaultCandidateIds, optionalNumber, quoteLink } from '../../../utils/sizing'

const draft = (over: Partial<CoreDraft> = {}): CoreDraft => ({
  ...emptyCoreDraft(),
  name: 'Bar-and-plate 600',
  faceWidthMm: 600,
  faceHeightMm: 300,
  depthMm: 76,
  price: '640.50',
  ...over,
})

describe('money typed in the major unit', () => {
  it.each([
    ['640', 64_000], ['640.5', 64_050], ['640.50', 64_050], ['0.07', 7], [' 12 ', 1_200],
  ])('reads %s as %i cents', (text, cents) => {
    expect(parseMoneyToCents(text)).toEqual({ cents })
  })

  it.each([
    ['640.505', /at most two decimals/], ['-5', /enter an amount/], ['1,240.00', /enter an amount/], ['12e3', /enter an amount/], ['100000.01', /at most 100,000/],
  ])('refuses %s', (text, message) => {
    const parsed = parseMoneyToCents(text)
    expect('error' in parsed && parsed.error).toMatch(message)
  })

  it('writes cents back as two decimals', () => {
    expect(centsToMoneyText(64_050)).toBe('640.50')
    expect(centsToMoneyText(null)).toBe('')
  })
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

describe('sizing page helpers', () => {
  const cores = [
    { id: 1, faceWidthMm: 300, faceHeightMm: 180, depthMm: 60 },
    { id: 2, faceWidthMm: 600, faceHeightMm: 300, depthMm: 76 },
    { id: 3, faceWidthMm: 280, faceHeightMm: 180, depthMm: 60 },
  ]
  it('offers the cores larger than the one fitted when the log was made', () => {
    expect(defaultCandidateIds(cores, cores[0])).toEqual([2])
    expect(defaultCandidateIds(cores, null)).toEqual([1, 2, 3])
  })

  it('builds the quote link the quotes page reads', () => {
    expect(quoteLink(4, 9, 2)).toBe('/quotes/new?vehicleId=4&sizingId=9&coreId=2')
  })

  it('leaves an empty number field out', () => {
    expect(optionalNumber('')).toBeUndefined()
    expect(optionalNumber(null)).toBeUndefined()
    expect(optionalNumber(35)).toBe(35)
  })
})
