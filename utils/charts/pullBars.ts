// Per-pull bars: how far the charge air sat above the ambient temperature, and how well the intercooler
// pulled it back towards ambient (effectiveness). Pure and unit-tested.
import type { EChartsOption } from 'echarts'
import type { DisplayTemperatureUnit } from '#shared/quantities/display'
import type { PullResult } from '#shared/types/report'
import { temperatureDifferenceIn, temperatureDifferenceSymbol } from '../displayUnits'
import { CHART_FONT, CHART_PALETTE } from './palette'

export interface PullBarsInput {
  pulls: readonly Pick<PullResult, 'index' | 'meanDeltaOverAmbientK' | 'effectiveness' | 'effectivenessSource'>[]
  temperature: DisplayTemperatureUnit
  animation?: boolean
}

const round1 = (value: number) => Math.round(value * 10) / 10

export const pullName = (index: number) => `Pull ${index + 1}`

export function pullBarsOption(input: PullBarsInput): EChartsOption {
  const { pulls, temperature } = input
  const estimated = pulls.some(p => p.effectivenessSource === 'estimated')
  const diff = temperatureDifferenceSymbol(temperature)
  return {
    animation: input.animation ?? false,
    textStyle: { fontFamily: CHART_FONT, color: CHART_PALETTE.ink },
    grid: { left: 48, right: 48, top: 72, bottom: 32 },
    legend: { type: 'scroll', top: 0, left: 0, right: 0, textStyle: { fontSize: 12 } },
    tooltip: { trigger: 'axis', axisPointer: { type: 'shadow' } },
    xAxis: { type: 'category', data: pulls.map(p => pullName(p.index)), axisLine: { lineStyle: { color: CHART_PALETTE.line } } },
    yAxis: [
      { type: 'value', name: `Temperature over ambient (${diff})`, nameTextStyle: { align: 'left' }, min: 0, splitLine: { lineStyle: { color: CHART_PALETTE.line } } },
      { type: 'value', name: 'Effectiveness (%)', nameTextStyle: { align: 'right' }, min: 0, max: 100, splitLine: { show: false } },
    ],
    series: [
      {
        type: 'bar',
        name: `Temperature over ambient (${diff})`,
        yAxisIndex: 0,
        itemStyle: { color: CHART_PALETTE.charge, borderRadius: [3, 3, 0, 0] },
        data: pulls.map(p => round1(temperatureDifferenceIn(p.meanDeltaOverAmbientK, temperature))),
      },
      {
        type: 'bar',
        name: estimated ? 'Effectiveness (%, estimated)' : 'Effectiveness (%)',
        yAxisIndex: 1,
        itemStyle: { color: CHART_PALETTE.ambient, borderRadius: [3, 3, 0, 0] },
        data: pulls.map(p => (p.effectiveness == null ? null : round1(p.effectiveness * 100))),
      },
    ],
  }
}
