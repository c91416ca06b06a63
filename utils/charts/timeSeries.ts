// Time series of one log: charge, pre-cooler and ambient temperature on the left axis, manifold
// pressure and engine speed on their own axes on the right; pulls shaded, masked spans marked.
// Pure: the same input gives the same option, so it is unit-tested without a browser.
import type { EChartsOption, SeriesOption } from 'echarts'
import type { DisplayPressureUnit, DisplayTemperatureUnit } from '#shared/quantities/display'
import { CHANNELS } from '#shared/quantities/channels'
import type { ChannelId, DownsampleResult, MaskSpan, PullResult, Series, SoakEvent } from '#shared/types/report'
import { seriesConversion, temperatureSymbol } from '../displayUnits'
import { CHART_FONT, CHART_PALETTE } from './palette'

export interface TimeSeriesInput {
  data: DownsampleResult
  pulls: readonly Pick<PullResult, 'index' | 'startS' | 'endS'>[]
  masks: readonly MaskSpan[]
  /** Soak events of the drive summary: the charge air heating up while slow or stopped. */
  soakEvents?: readonly SoakEvent[]
  units: { temperature: DisplayTemperatureUnit, pressure: DisplayPressureUnit }
  /** Visible window, s (dataZoom); the whole log when absent. */
  window?: { fromS: number, toS: number } | null
  animation?: boolean
  /** Narrow screen: engine speed keeps its line but not its own axis labels, to leave room for the plot. */
  compact?: boolean
}

// Lines are named by the channel catalogue's labels (the glossary's words).
const TEMPERATURE_CHANNELS: Partial<Record<ChannelId, { name: string, color: string }>> = {
  chargeTemp: { name: CHANNELS.chargeTemp.label, color: CHART_PALETTE.charge },
  preCoolerTemp: { name: CHANNELS.preCoolerTemp.label, color: CHART_PALETTE.preCooler },
  ambientTemp: { name: CHANNELS.ambientTemp.label, color: CHART_PALETTE.ambient },
}

const MASK_WORDS: Record<MaskSpan['reason'], string> = {
  'engine-off': 'Engine off',
  'restart-settle': 'Settling after restart',
  'temp-spike': 'Sensor jump',
  'below-ambient': 'Below ambient',
  'sensor-dropout': 'Sensor gave no reading',
  'temp-step': 'Sensor step',
  'clipped': 'Sensor at its limit',
}

export const maskLabel = (reason: MaskSpan['reason']) => MASK_WORDS[reason]

/** Points of a series as [t, v] pairs in display units; null stays null so the line shows a gap. */
export function seriesPoints(series: Series, units: TimeSeriesInput['units']): [number, number | null][] {
  const { scale, offset } = seriesConversion(series.unit, units)
  return series.t.map((t, i) => {
    const v = series.v[i]
    return [t, v == null ? null : round(v * scale + offset, 2)]
  })
}

const round = (value: number, digits: number) => {
  const f = 10 ** digits
  return Math.round(value * f) / f
}

function line(name: string, color: string, data: [number, number | null][], yAxisIndex: number, extra: Partial<SeriesOption> = {}): SeriesOption {
  return {
    type: 'line',
    name,
    data,
    yAxisIndex,
    showSymbol: false,
    connectNulls: false,
    lineStyle: { width: yAxisIndex === 0 ? 2 : 1.25, color },
    itemStyle: { color },
    emphasis: { disabled: true },
    ...extra,
  } as SeriesOption
}

export function timeSeriesOption(input: TimeSeriesInput): EChartsOption {
  const { data, pulls, masks, units } = input
  const byChannel = new Map(data.series.map(s => [s.channel, s]))
  const series: SeriesOption[] = []

  for (const [channel, look] of Object.entries(TEMPERATURE_CHANNELS) as [ChannelId, { name: string, color: string }][]) {
    const found = byChannel.get(channel)
    if (!found) continue
    series.push(line(look.name, look.color, seriesPoints(found, units), 0))
  }
  const pressure = byChannel.get('manifoldPressure') ?? byChannel.get('boost')
  if (pressure) {
    series.push(line(pressure.channel === 'boost' ? 'Boost (gauge)' : 'Boost (absolute)', CHART_PALETTE.pressure, seriesPoints(pressure, units), 1, { lineStyle: { width: 1.25, color: CHART_PALETTE.pressure, type: 'dashed' } }))
  }
  const rpm = byChannel.get('rpm')
  if (rpm) series.push(line(CHANNELS.rpm.label, CHART_PALETTE.rpm, seriesPoints(rpm, units), 2, { lineStyle: { width: 1, color: CHART_PALETTE.rpm, opacity: 0.7 } }))

  // Shading rides on an empty helper series so it shows whatever lines the log has.
  series.push({
    type: 'line',
    name: 'Pulls',
    data: [],
    yAxisIndex: 0,
    itemStyle: { color: CHART_PALETTE.pullShade },
    markArea: {
      silent: true,
      itemStyle: { color: CHART_PALETTE.pullShade },
      label: { show: true, position: 'insideTop', color: CHART_PALETTE.inkSoft, fontSize: 11 },
      data: pulls.map(p => [{ name: `${p.index + 1}`, xAxis: p.startS }, { xAxis: p.endS }]),
    },
  } as SeriesOption)
  if (masks.length) {
    series.push({
      type: 'line',
      name: 'Left out',
      data: [],
      yAxisIndex: 0,
      itemStyle: { color: CHART_PALETTE.mask },
      markArea: {
        silent: true,
        itemStyle: { color: CHART_PALETTE.maskShade, borderColor: CHART_PALETTE.mask, borderWidth: 0.5, borderType: 'dashed' },
        label: { show: false },
        data: masks.map(m => [{ name: maskLabel(m.reason), xAxis: m.startS }, { xAxis: m.endS }]),
      },
    } as SeriesOption)
  }

  const soak = input.soakEvents ?? []
  if (soak.length) {
    series.push({
      type: 'line',
      name: 'Soak events',
      data: [],
      yAxisIndex: 0,
      itemStyle: { color: CHART_PALETTE.soak },
      markArea: {
        silent: true,
        itemStyle: { color: CHART_PALETTE.soakShade },
        label: { show: true, position: 'insideBottom', color: CHART_PALETTE.inkSoft, fontSize: 11 },
        data: soak.map(e => [{ name: `+${round(e.riseK, 1)} K`, xAxis: e.startS }, { xAxis: e.endS }]),
      },
    } as SeriesOption)
  }

  const window = input.window
  const zoomRange = window ? { startValue: window.fromS, endValue: window.toS } : { start: 0, end: 100 }
  const pressureUnit = units.pressure
  return {
    animation: input.animation ?? false,
    textStyle: { fontFamily: CHART_FONT, color: CHART_PALETTE.ink },
    color: [CHART_PALETTE.charge, CHART_PALETTE.preCooler, CHART_PALETTE.ambient, CHART_PALETTE.pressure, CHART_PALETTE.rpm],
    grid: { left: 40, right: input.compact ? 44 : 96, top: 64, bottom: 64 },
    // One scrolling line, so a narrow phone screen never pushes the legend onto the axis names.
    legend: { type: 'scroll', top: 0, left: 0, right: 0, itemGap: 12, textStyle: { fontSize: 12 } },
    tooltip: { trigger: 'axis', axisPointer: { type: 'line', label: { formatter: ({ value }) => `${round(Number(value), 1)} s` } }, valueFormatter: v => (typeof v === 'number' ? String(round(v, 1)) : '—') },
    xAxis: {
      type: 'value',
      name: 'Time (s)',
      nameLocation: 'middle',
      nameGap: 26,
      min: data.fromS,
      max: data.toS,
      // The ends are real sample times (e.g. 4837.853999 s): label them as whole seconds.
      axisLabel: { formatter: (v: number) => Math.round(v).toLocaleString('en-GB') },
      axisLine: { lineStyle: { color: CHART_PALETTE.line } },
      splitLine: { show: false },
    },
    yAxis: [
      { type: 'value', name: temperatureSymbol(units.temperature), scale: true, position: 'left', splitLine: { lineStyle: { color: CHART_PALETTE.line } } },
      { type: 'value', name: pressureUnit, scale: true, position: 'right', splitLine: { show: false }, axisLabel: { formatter: (v: number) => String(round(v, pressureUnit === 'bar' ? 2 : 0)) } },
      { type: 'value', name: 'rpm', scale: true, position: 'right', offset: 48, show: !input.compact, splitLine: { show: false } },
    ],
    dataZoom: [
      { type: 'inside', xAxisIndex: 0, filterMode: 'none', ...zoomRange },
      { type: 'slider', xAxisIndex: 0, filterMode: 'none', height: 18, bottom: 8, ...zoomRange },
    ],
    series,
  }
}

/**
 * Overview plus the detail of the zoomed window: outside the window the overview's points, inside
 * it the detail's (fetched at full resolution for that window). Channels missing from the detail
 * keep the overview.
 */
export function mergeDetail(overview: DownsampleResult, detail: DownsampleResult | null): DownsampleResult {
  if (!detail) return overview
  const byChannel = new Map(detail.series.map(s => [s.channel, s]))
  return {
    ...overview,
    series: overview.series.map((base) => {
      const fine = byChannel.get(base.channel)
      if (!fine || fine.unit !== base.unit) return base
      const t: number[] = []
      const v: (number | null)[] = []
      let inserted = false
      base.t.forEach((time, i) => {
        if (time < detail.fromS || time > detail.toS) {
          t.push(time)
          v.push(base.v[i] ?? null)
          return
        }
        if (!inserted) {
          t.push(...fine.t)
          v.push(...fine.v)
          inserted = true
        }
      })
      if (!inserted) {
        // The window fell between two overview points: splice the detail in by time.
        const at = t.findIndex(time => time > detail.toS)
        const cut = at < 0 ? t.length : at
        t.splice(cut, 0, ...fine.t)
        v.splice(cut, 0, ...fine.v)
      }
      return { ...base, t, v }
    }),
  }
}
