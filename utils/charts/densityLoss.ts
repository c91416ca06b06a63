// Per pull: charge density against the standard-day reference (ISA sea level, 1.225 kg/m³) and the
// power the hotter charge costs against the coolest pull (density law, same boost). Pure and unit-tested.
import type { EChartsOption } from 'echarts'
import type { PullResult } from '#shared/types/report'
import { CHART_FONT, CHART_PALETTE } from './palette'
import { pullName } from './pullBars'

export interface DensityLossInput {
  pulls: readonly Pick<PullResult, 'index' | 'densityRatioIsa' | 'powerLossVsCoolestPct'>[]
  animation?: boolean
}

const round = (value: number, digits: number) => {
  const f = 10 ** digits
  return Math.round(value * f) / f
}

export function densityLossOption(input: DensityLossInput): EChartsOption {
  const { pulls } = input
  return {
    animation: input.animation ?? false,
    textStyle: { fontFamily: CHART_FONT, color: CHART_PALETTE.ink },
    grid: { left: 48, right: 48, top: 72, bottom: 32 },
    legend: { type: 'scroll', top: 0, left: 0, right: 0, textStyle: { fontSize: 12 } },
    tooltip: { trigger: 'axis' },
    xAxis: { type: 'category', data: pulls.map(p => pullName(p.index)), axisLine: { lineStyle: { color: CHART_PALETTE.line } } },
    yAxis: [
      { type: 'value', name: 'Density × standard air', nameTextStyle: { align: 'left' }, scale: true, splitLine: { lineStyle: { color: CHART_PALETTE.line } } },
      { type: 'value', name: 'Power lost (%)', nameTextStyle: { align: 'right' }, min: 0, splitLine: { show: false } },
    ],
    series: [
      {
        type: 'bar',
        name: 'Power lost vs coolest pull (%)',
        yAxisIndex: 1,
        itemStyle: { color: CHART_PALETTE.mask, borderRadius: [3, 3, 0, 0] },
        data: pulls.map(p => round(p.powerLossVsCoolestPct, 2)),
      },
      {
        type: 'line',
        name: 'Charge density × standard air',
        yAxisIndex: 0,
        symbolSize: 7,
        lineStyle: { color: CHART_PALETTE.pressure, width: 2 },
        itemStyle: { color: CHART_PALETTE.pressure },
        data: pulls.map(p => (p.densityRatioIsa == null ? null : round(p.densityRatioIsa, 3))),
      },
    ],
  }
}
