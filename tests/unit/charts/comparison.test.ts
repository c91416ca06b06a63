import { describe, expect, it } from 'vitest'
import { pullOverlayOption, referenceChargeOption } from '../../../utils/charts/comparison'

type Line = { name: string, data: Array<{ value: number | null, itemStyle: { color: string } }> }
type Bars = { name: string, data: Array<number | null> }

const pulls = [
  { side: 'before' as const, pull: 1, deltaOverAmbientK: 38, effectiveness: 0.62, matched: true, chargeTempAtReferenceC: 60 },
  { side: 'before' as const, pull: 2, deltaOverAmbientK: 36, effectiveness: 0.64, matched: true, chargeTempAtReferenceC: 59 },
  { side: 'before' as const, pull: 3, deltaOverAmbientK: 30, effectiveness: 0.7, matched: false, chargeTempAtReferenceC: 55 },
  { side: 'after' as const, pull: 1, deltaOverAmbientK: 16, effectiveness: 0.84, matched: true, chargeTempAtReferenceC: 41 },
  { side: 'after' as const, pull: 2, deltaOverAmbientK: 18, effectiveness: null, matched: false, chargeTempAtReferenceC: null },
]

describe('pullOverlayOption', () => {
  it('draws before and after pull by pull, as many pulls as the longer side', () => {
    const option = pullOverlayOption({ pulls, quantity: 'delta', temperature: 'C' })
    expect((option.xAxis as { data: string[] }).data).toEqual(['Pull 1', 'Pull 2', 'Pull 3'])
    const [before, after] = option.series as unknown as Line[]
    expect(before!.name).toBe('Before')
    expect(before!.data.map(d => d.value)).toEqual([38, 36, 30])
    expect(after!.data.map(d => d.value)).toEqual([16, 18])
  })

  it('gives effectiveness in % and leaves a gap where it is unknown', () => {
    const [, after] = pullOverlayOption({ pulls, quantity: 'effectiveness', temperature: 'C' }).series as unknown as Line[]
    expect(after!.data.map(d => d.value)).toEqual([84, null])
  })

  it('draws unmatched pulls hollow', () => {
    const [before] = pullOverlayOption({ pulls, quantity: 'delta', temperature: 'C' }).series as unknown as Line[]
    expect(before!.data[0]!.itemStyle.color).not.toBe('#ffffff')
    expect(before!.data[2]!.itemStyle.color).toBe('#ffffff')
  })

  it('shows temperature over ambient in °F as 1.8 × the kelvin', () => {
    const option = pullOverlayOption({ pulls, quantity: 'delta', temperature: 'F' })
    const [before] = option.series as unknown as Line[]
    expect(before!.data[0]!.value).toBe(68.4)
    expect((option.yAxis as { name: string }).name).toContain('°F')
  })
})

describe('referenceChargeOption', () => {
  it('sets the logged charge temperatures beside the ones at the reference ambient', () => {
    const option = referenceChargeOption({
      before: { meanChargeTempC: 40.4, chargeTempAtReferenceC: 59.51, ambientTempC: 14 },
      after: { meanChargeTempC: 43.3, chargeTempAtReferenceC: 40.86, ambientTempC: 32 },
      referenceAmbientC: 25,
      temperature: 'C',
    })
    expect((option.xAxis as { data: string[] }).data[1]).toBe('At 25 °C ambient')
    const [before, after] = option.series as unknown as Bars[]
    expect(before!.data).toEqual([40.4, 59.5])
    expect(after!.data).toEqual([43.3, 40.9])
  })

  it('converts to °F, reference included', () => {
    const option = referenceChargeOption({
      before: { meanChargeTempC: 40, chargeTempAtReferenceC: null, ambientTempC: 14 },
      after: { meanChargeTempC: 50, chargeTempAtReferenceC: null, ambientTempC: 32 },
      referenceAmbientC: 25,
      temperature: 'F',
    })
    expect((option.xAxis as { data: string[] }).data[1]).toBe('At 77 °F ambient')
    const [before] = option.series as unknown as Bars[]
    expect(before!.data).toEqual([104, null])
  })
})
