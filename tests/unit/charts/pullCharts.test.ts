import { describe, expect, it } from 'vitest'
import { densityLossOption } from '../../../utils/charts/densityLoss'
import { pullBarsOption } from '../../../utils/charts/pullBars'
import { analysisWith, pull } from '../../fixtures/report'

type Bar = { name: string, yAxisIndex: number, data: (number | null)[] }

describe('pullBarsOption', () => {
  const pulls = analysisWith(2).pulls

  it('draws the temperature over ambient and effectiveness per pull', () => {
    const option = pullBarsOption({ pulls, temperature: 'C' })
    expect((option.xAxis as { data: string[] }).data).toEqual(['Pull 1', 'Pull 2', 'Pull 3', 'Pull 4', 'Pull 5', 'Pull 6'])
    const [delta, effectiveness] = option.series as unknown as Bar[]
    expect(delta!.data).toEqual([10, 12, 14, 16, 18, 20])
    // ε = (130 − 40)/100 = 0.9 → 90 %
    expect(effectiveness!.data[0]).toBe(90)
    expect(effectiveness!.yAxisIndex).toBe(1)
  })

  it('shows a temperature difference in °F as 1.8 × the kelvin', () => {
    const [delta] = pullBarsOption({ pulls, temperature: 'F' }).series as unknown as Bar[]
    expect(delta!.data[0]).toBe(18)
    expect(delta!.name).toMatch(/°F/)
  })

  it('says when effectiveness is an estimate, and leaves a gap where there is none', () => {
    const option = pullBarsOption({ pulls: [pull(0, 40, { effectivenessSource: 'estimated' }), pull(1, 42, { effectiveness: null, effectivenessSource: null })], temperature: 'C' })
    const [, effectiveness] = option.series as unknown as Bar[]
    expect(effectiveness!.name).toMatch(/estimated/)
    expect(effectiveness!.data[1]).toBeNull()
  })
})

describe('densityLossOption', () => {
  it('pairs density against standard air with the power lost per pull', () => {
    const option = densityLossOption({ pulls: analysisWith(1.8).pulls })
    const [loss, density] = option.series as unknown as Bar[]
    expect(loss!.yAxisIndex).toBe(1)
    expect(loss!.data[0]).toBe(0)
    expect(loss!.data[5]).toBeCloseTo(2.79, 2)
    expect(density!.data[0]).toBe(2.1)
    expect(option.animation).toBe(false)
  })

  it('leaves a gap where a pull has no boost reading', () => {
    const [, density] = densityLossOption({ pulls: [pull(0, 40, { densityRatioIsa: null })] }).series as unknown as Bar[]
    expect(density!.data).toEqual([null])
  })
})
