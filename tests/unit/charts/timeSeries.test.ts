import { describe, expect, it } from 'vitest'
import type { DownsampleResult } from '../../../shared/types/report'
import { mergeDetail, seriesPoints, timeSeriesOption } from '../../../utils/charts/timeSeries'
import { analysisWith, seriesFixture } from '../../fixtures/report'

type AnySeries = { name: string, type: string, yAxisIndex: number, data: [number, number | null][], markArea?: { data: { name?: string, xAxis: number }[][] } }
const seriesOf = (option: ReturnType<typeof timeSeriesOption>) => option.series as unknown as AnySeries[]

describe('timeSeriesOption', () => {
  const analysis = analysisWith(1.8)
  const base = { data: seriesFixture(), pulls: analysis.pulls, masks: analysis.masks, units: { temperature: 'C', pressure: 'kPa' } as const }

  it('puts temperatures on the left axis in °C, converted from the API\'s kelvin', () => {
    const charge = seriesOf(timeSeriesOption(base)).find(s => s.name === 'Charge temperature')!
    expect(charge.yAxisIndex).toBe(0)
    expect(charge.data[0]).toEqual([0, 40])
    expect(charge.data[10]).toEqual([100, 50])
  })

  it('follows the display units: °F and psi', () => {
    const option = timeSeriesOption({ ...base, units: { temperature: 'F', pressure: 'psi' } })
    const series = seriesOf(option)
    expect(series.find(s => s.name === 'Charge temperature')!.data[0]![1]).toBe(104)
    // 200 kPa = 29.01 psi
    expect(series.find(s => s.name === 'Boost (absolute)')!.data[0]![1]).toBeCloseTo(29.01, 2)
    expect((option.yAxis as { name: string }[])[0]!.name).toBe('°F')
    expect((option.yAxis as { name: string }[])[1]!.name).toBe('psi')
  })

  it('labels the time axis in whole seconds, even at a ragged last sample', () => {
    const option = timeSeriesOption({ ...base, data: { ...seriesFixture(), toS: 4837.853999999999 } })
    const formatter = (option.xAxis as { axisLabel: { formatter: (v: number) => string } }).axisLabel.formatter
    expect(formatter(4837.853999999999)).toBe('4,838')
  })

  it('gives boost and engine speed their own axes', () => {
    const series = seriesOf(timeSeriesOption(base))
    expect(series.find(s => s.name === 'Boost (absolute)')!.yAxisIndex).toBe(1)
    expect(series.find(s => s.name === 'Engine speed')!.yAxisIndex).toBe(2)
  })

  it('keeps a missing reading as a gap, not a zero', () => {
    const pressure = seriesOf(timeSeriesOption(base)).find(s => s.name === 'Boost (absolute)')!
    expect(pressure.data[5]).toEqual([50, null])
  })

  it('shades every pull, numbered from 1, and marks the left-out spans', () => {
    const series = seriesOf(timeSeriesOption(base))
    const pulls = series.find(s => s.name === 'Pulls')!.markArea!.data
    expect(pulls).toHaveLength(6)
    expect(pulls[0]).toEqual([{ name: '1', xAxis: 60 }, { xAxis: 67 }])
    const masks = series.find(s => s.name === 'Left out')!.markArea!.data
    expect(masks).toEqual([[{ name: 'Engine off', xAxis: 300 }, { xAxis: 312 }]])
  })

  it('leaves out the mask series when nothing was masked, and lines the log lacks', () => {
    const data = seriesFixture()
    data.series = data.series.filter(s => s.channel === 'chargeTemp')
    const names = seriesOf(timeSeriesOption({ ...base, data, masks: [] })).map(s => s.name)
    expect(names).toEqual(['Charge temperature', 'Pulls'])
  })

  it('zooms by value to the window it is given, and shows the whole log otherwise', () => {
    const zoomed = timeSeriesOption({ ...base, window: { fromS: 20, toS: 40 } })
    expect(zoomed.dataZoom).toEqual(expect.arrayContaining([expect.objectContaining({ type: 'slider', startValue: 20, endValue: 40 })]))
    const whole = timeSeriesOption(base)
    expect(whole.dataZoom).toEqual(expect.arrayContaining([expect.objectContaining({ type: 'inside', start: 0, end: 100 })]))
  })

  it('leaves the engine-speed axis out on a narrow screen, widening the plot', () => {
    const wide = timeSeriesOption(base)
    const narrow = timeSeriesOption({ ...base, compact: true })
    expect((wide.yAxis as { show?: boolean }[])[2]!.show).toBe(true)
    expect((narrow.yAxis as { show?: boolean }[])[2]!.show).toBe(false)
    expect((narrow.grid as { right: number }).right).toBeLessThan((wide.grid as { right: number }).right)
  })

  it('has animation off unless asked', () => {
    expect(timeSeriesOption(base).animation).toBe(false)
    expect(timeSeriesOption({ ...base, animation: true }).animation).toBe(true)
  })
})

describe('seriesPoints', () => {
  it('converts pascal to the chosen pressure unit', () => {
    expect(seriesPoints({ channel: 'manifoldPressure', unit: 'Pa', t: [0], v: [150000] }, { temperature: 'C', pressure: 'bar' })).toEqual([[0, 1.5]])
  })
})

describe('mergeDetail', () => {
  it('replaces the overview inside the zoomed window with the detail', () => {
    const overview = seriesFixture()
    const detail: DownsampleResult = {
      fromS: 20, toS: 40, sampleCount: 200, method: 'minmax',
      series: [{ channel: 'chargeTemp', unit: 'K', t: [20, 25, 30, 35, 40], v: [1, 2, 3, 4, 5] }],
    }
    const merged = mergeDetail(overview, detail)
    const charge = merged.series.find(s => s.channel === 'chargeTemp')!
    expect(charge.t).toEqual([0, 10, 20, 25, 30, 35, 40, 50, 60, 70, 80, 90, 100])
    expect(charge.v.slice(2, 7)).toEqual([1, 2, 3, 4, 5])
    // Channels the detail lacks keep the overview untouched.
    expect(merged.series.find(s => s.channel === 'rpm')).toEqual(overview.series.find(s => s.channel === 'rpm'))
  })

  it('splices a detail that falls between two overview points in time order', () => {
    const overview = seriesFixture()
    const detail: DownsampleResult = { fromS: 12, toS: 14, sampleCount: 3, method: 'minmax', series: [{ channel: 'chargeTemp', unit: 'K', t: [12, 13, 14], v: [7, 8, 9] }] }
    const charge = mergeDetail(overview, detail).series.find(s => s.channel === 'chargeTemp')!
    expect(charge.t.slice(0, 5)).toEqual([0, 10, 12, 13, 14])
    expect(charge.t).toEqual([...charge.t].sort((a, b) => a - b))
  })

  it('returns the overview when there is no detail', () => {
    const overview = seriesFixture()
    expect(mergeDetail(overview, null)).toBe(overview)
  })

  it('shades the soak events of the drive with their rise, only when there are any', () => {
    const analysis = analysisWith(1.8)
    const base = { data: seriesFixture(), pulls: analysis.pulls, masks: analysis.masks, units: { temperature: 'C', pressure: 'kPa' } as const }
    const withSoak = seriesOf(timeSeriesOption({ ...base, soakEvents: [{ startS: 320, endS: 360, riseK: 11.04, recoveryS: 45 }] }))
    expect(withSoak.find(s => s.name === 'Soak events')!.markArea!.data).toEqual([[{ name: '+11 K', xAxis: 320 }, { xAxis: 360 }]])
    expect(seriesOf(timeSeriesOption({ ...base, soakEvents: [] })).some(s => s.name === 'Soak events')).toBe(false)
  })
})
