import { describe, expect, it } from 'vitest'
import { downsample, generateDemoLog, importLog } from '../../../server/analysis/index'
import type { LogChannels } from '../../../server/analysis/index'

function synthetic(n: number): LogChannels {
  const timeS = new Float64Array(n)
  const chargeTempK = new Float32Array(n)
  for (let i = 0; i < n; i++) {
    timeS[i] = i * 0.01
    chargeTempK[i] = 300 + Math.sin(i / 500) * 10
  }
  chargeTempK[54321] = 420 // a spike the chart must still show
  chargeTempK[1000] = Number.NaN
  return { timeS, chargeTempK }
}

describe('downsample', () => {
  const channels = synthetic(100_000)
  for (const method of ['minmax', 'lttb'] as const) {
    it(`${method}: stays within the point budget and the window`, () => {
      const result = downsample(channels, ['chargeTemp'], { fromS: 100, toS: 800, points: 500, method })
      const series = result.series[0]!
      expect(series.t.length).toBeLessThanOrEqual(500)
      expect(series.t.length).toBeGreaterThan(400)
      expect(Math.min(...series.t)).toBeGreaterThanOrEqual(100)
      expect(Math.max(...series.t)).toBeLessThanOrEqual(800)
      expect(series.t.every((t, i) => i === 0 || t >= series.t[i - 1]!)).toBe(true)
      expect(series.unit).toBe('K')
    })
  }

  it('keeps the extreme of each bucket (minmax)', () => {
    const series = downsample(channels, ['chargeTemp'], { points: 200 }).series[0]!
    expect(Math.max(...series.v.map(v => v ?? 0))).toBeCloseTo(420, 3)
  })

  it('returns the raw samples when the window holds fewer than the budget', () => {
    const result = downsample(channels, ['chargeTemp'], { fromS: 10, toS: 10.5, points: 100 })
    expect(result.series[0]!.t.length).toBe(51)
    expect(result.sampleCount).toBe(51)
  })

  it('skips channels the log lacks and rejects bad windows', async () => {
    const log = await importLog(generateDemoLog('front-mount-after').csv)
    const result = downsample(log.channels, ['chargeTemp', 'humidity', 'ambientTemp'], { points: 100 })
    expect(result.series.map(s => s.channel)).toEqual(['chargeTemp', 'ambientTemp'])
    expect(() => downsample(channels, ['chargeTemp'], { fromS: 50, toS: 10 })).toThrow(/not valid/)
    expect(() => downsample(channels, ['chargeTemp'], { points: 3 })).toThrow(/points/)
  })
})
