// Before vs after charts of a comparison: per-pull overlays (temperature over ambient,
// effectiveness) and the charge temperature both cores would give at the reference ambient.
// Pure and unit-tested; the component only binds the option.
import type { EChartsOption } from 'echarts'
import type { DisplayTemperatureUnit } from '#shared/quantities/display'
import type { ComparedPull, SideSummary } from '#shared/types/comparison'
import { temperatureDifferenceIn, temperatureDifferenceSymbol, temperatureIn, temperatureSymbol } from '../displayUnits'
import { CHART_FONT, CHART_PALETTE } from './palette'

type PullPoint = Pick<ComparedPull, 'side' | 'pull' | 'deltaOverAmbientK' | 'effectiveness' | 'matched' | 'chargeTempAtReferenceC'>

export const SIDE_COLOURS = { before: CHART_PALETTE.charge, after: CHART_PALETTE.ambient } as const
const SIDE_NAMES = { before: 'Before', after: 'After' } as const

const round1 = (value: number) => Math.round(value * 10) / 10

export interface OverlayInput {
  pulls: readonly PullPoint[]
  quantity: 'delta' | 'effectiveness'
  temperature: DisplayTemperatureUnit
  animation?: boolean
}

/**
 * One line per side, pull by pull in logged order (Pull 1, 2, …; several logs a side follow on).
 * Unmatched pulls are drawn hollow: they are shown, but the statistics leave them out.
 */
export function pullOverlayOption(input: OverlayInput): EChartsOption {
  const { pulls, quantity, temperature } = input
  const bySide = (side: 'before' | 'after') => pulls.filter(p => p.side === side)
  const count = Math.max(bySide('before').length, bySide('after').length)
  const value = (p: PullPoint) => quantity === 'delta'
    ? round1(temperatureDifferenceIn(p.deltaOverAmbientK, temperature))
    : p.effectiveness == null ? null : round1(p.effectiveness * 100)
  const axisName = quantity === 'delta' ? `Above ambient (${temperatureDifferenceSymbol(temperature)})` : 'Effectiveness (%)'
  return {
    animation: input.animation ?? false,
    textStyle: { fontFamily: CHART_FONT, color: CHART_PALETTE.ink },
    grid: { left: 48, right: 16, top: 48, bottom: 32 },
    legend: { top: 0, left: 0, textStyle: { fontSize: 12 } },
    tooltip: { trigger: 'axis' },
    xAxis: { type: 'category', data: Array.from({ length: count }, (_, i) => `Pull ${i + 1}`), axisLine: { lineStyle: { color: CHART_PALETTE.line } } },
    yAxis: { type: 'value', name: axisName, nameTextStyle: { align: 'left' }, scale: quantity === 'effectiveness', min: quantity === 'delta' ? 0 : undefined, splitLine: { lineStyle: { color: CHART_PALETTE.line } } },
    series: (['before', 'after'] as const).map(side => ({
      type: 'line' as const,
      name: SIDE_NAMES[side],
      color: SIDE_COLOURS[side],
      symbol: 'circle',
      symbolSize: 9,
      lineStyle: { width: 2 },
      data: bySide(side).map(p => ({
        value: value(p),
        itemStyle: p.matched ? { color: SIDE_COLOURS[side] } : { color: '#ffffff', borderColor: SIDE_COLOURS[side], borderWidth: 2 },
      })),
    })),
  }
}

export interface ReferenceInput {
  before: Pick<SideSummary, 'chargeTempAtReferenceC' | 'ambientTempC' | 'meanChargeTempC'>
  after: Pick<SideSummary, 'chargeTempAtReferenceC' | 'ambientTempC' | 'meanChargeTempC'>
  referenceAmbientC: number
  temperature: DisplayTemperatureUnit
  animation?: boolean
}

/**
 * Two pairs of bars: the charge temperature each side logged on its own day, and what each core
 * would give at the reference ambient. The pair that matters is the second; the first shows why
 * raw temperatures mislead when the days differ.
 */
export function referenceChargeOption(input: ReferenceInput): EChartsOption {
  const { before, after, referenceAmbientC, temperature } = input
  const t = (c: number | null) => (c == null ? null : round1(temperatureIn(c, temperature)))
  const unit = temperatureSymbol(temperature)
  return {
    animation: input.animation ?? false,
    textStyle: { fontFamily: CHART_FONT, color: CHART_PALETTE.ink },
    grid: { left: 48, right: 16, top: 48, bottom: 48 },
    legend: { top: 0, left: 0, textStyle: { fontSize: 12 } },
    tooltip: { trigger: 'axis', axisPointer: { type: 'shadow' } },
    xAxis: {
      type: 'category',
      data: ['As logged, each on its day', `At ${t(referenceAmbientC)} ${unit} ambient`],
      axisLabel: { interval: 0 },
      axisLine: { lineStyle: { color: CHART_PALETTE.line } },
    },
    yAxis: { type: 'value', name: `Charge temperature (${unit})`, nameTextStyle: { align: 'left' }, splitLine: { lineStyle: { color: CHART_PALETTE.line } } },
    series: ([['before', before], ['after', after]] as const).map(([side, s]) => ({
      type: 'bar' as const,
      name: SIDE_NAMES[side],
      color: SIDE_COLOURS[side],
      itemStyle: { borderRadius: [3, 3, 0, 0] },
      label: { show: true, position: 'top' as const, formatter: `{c} ${unit}` },
      data: [t(s.meanChargeTempC), t(s.chargeTempAtReferenceC)],
    })),
  }
}
