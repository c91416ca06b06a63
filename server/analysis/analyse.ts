// From canonical channels to the analysis JSON of issue 3:
// { summary, pulls, masks, warnings, mapping }. SI inside; °C, kPa and % only in named output fields.
import { isaPressureAtElevationPa } from './atmosphere'
import type { LogChannels } from './channels'
import { compressorOutletTempK, DEFAULT_COMPRESSOR_EFFICIENCY } from './compressor'
import { KELVIN_OFFSET } from './constants'
import { chargeDewPointC, densityRatioIsa } from './density'
import { intercoolerEffectiveness } from './effectiveness'
import { LogImportError } from './import/errors'
import type { ImportedLog, ImportWarning } from './import/importer'
import { mappedFixedValueSI } from './import/importer'
import type { LogMapping } from './import/mapping'
import { computeMasks } from './masks'
import type { MaskOptions, MaskSpan } from './masks'
import { powerLossPct } from './power'
import { applyPullEdits, detectPulls } from './pulls'
import type { PullEdits, PullOptions, PullOrigin, PullWindow } from './pulls'
import { projectPullsUntilLoss, recoveryTimeConstant, soakTrend } from './soak'
import type { SoakProjection } from './soak'

export interface AnalyseOptions {
  /** Ambient temperature, °C: required when the log has no ambient channel. */
  ambientTempC?: number
  /** Site altitude (geometric), m: ISA barometric pressure when there is no baro channel or value. */
  altitudeM?: number
  /** Barometric pressure, kPa (overrides altitude). */
  baroKpa?: number
  /** Relative humidity, % (for the charge dew-point warning). */
  humidityPct?: number
  /** Rated engine power, kW: power losses are also given in kW. */
  ratedPowerKw?: number
  /** Pull threshold, % (default 90). */
  pullThresholdPct?: number
  /** Minimum pull duration, s (default 3). */
  pullMinDurationS?: number
  /** Load channel for pulls (default: pedal if present, else throttle). */
  pullChannel?: 'pedal' | 'throttle'
  /** Compressor isentropic efficiency for the estimated pre-cooler temperature (default 0.70). */
  compressorEfficiency?: number
  /** Loss the soak projection looks for, % (default 5). */
  projectionLossPct?: number
  /** Fine-tuning of the quality masks. */
  masks?: Partial<MaskOptions>
  /** A tuner's corrections to the detected pulls. */
  pullEdits?: PullEdits
  /** Mapping to report (taken from the imported log when one is passed). */
  mapping?: LogMapping
}

export interface PullResult {
  index: number
  startS: number
  endS: number
  durationS: number
  origin: PullOrigin
  /** Index among the automatically detected pulls, as pull edits name them (null for an added pull). */
  autoIndex: number | null
  meanChargeTempC: number
  peakChargeTempC: number
  ambientTempC: number
  meanDeltaOverAmbientK: number
  meanManifoldKpa: number | null
  pressureRatio: number | null
  /** Mean pre-cooler temperature, measured or estimated from the compressor relation. */
  preCoolerTempC: number | null
  effectiveness: number | null
  effectivenessSource: 'measured' | 'estimated' | null
  densityRatioIsa: number | null
  powerLossVsCoolestPct: number
  powerLossVsAmbientPct: number
  powerLossVsCoolestKw: number | null
  powerLossVsAmbientKw: number | null
  meanRpm: number | null
  meanSpeedKmh: number | null
  /** Share of the pull's samples inside a mask (left out of the means). */
  maskedFraction: number
  /** Charge dew point at the pull's boost, °C (only with humidity). */
  chargeDewPointC: number | null
}

export interface AnalysisWarning {
  code: string
  message: string
  channel?: string
  column?: string
  line?: number
}

export interface AnalysisSummary {
  pullCount: number
  peakChargeTempC: number | null
  maxPowerLossVsCoolestPct: number | null
  maxPowerLossVsAmbientPct: number | null
  maxPowerLossVsCoolestKw: number | null
  soakIndexKPerPull: number | null
  soakFitR2: number | null
  /** Last pull's mean charge temperature minus the first's, K. */
  chargeTempRiseK: number | null
  recoveryTimeConstantS: number | null
  projection: SoakProjection
  meanEffectiveness: number | null
  effectivenessSource: 'measured' | 'estimated' | null
  meanDeltaOverAmbientK: number | null
  ambientTempC: number | null
  ambientSource: 'channel' | 'entered'
  baroKpa: number
  baroSource: 'channel' | 'entered' | 'isa'
  pullChannel: 'pedal' | 'throttle' | null
  pullThresholdPct: number
  maxLoadPct: number | null
  durationS: number
  sampleCount: number
  maskedS: number
  compressorEfficiency: number
  /** What every power figure assumes (show it beside them in the UI). */
  powerLossBasis: string
}

export interface AnalysisResult {
  summary: AnalysisSummary
  pulls: PullResult[]
  masks: MaskSpan[]
  warnings: AnalysisWarning[]
  mapping: LogMapping
}

function isImported(input: LogChannels | ImportedLog): input is ImportedLog {
  return 'channels' in input && 'mapping' in input
}

const round = (value: number, digits: number): number => {
  const f = 10 ** digits
  return Math.round(value * f) / f
}
const orNull = (value: number, digits: number): number | null => (Number.isFinite(value) ? round(value, digits) : null)

function checkOption(name: string, value: number | undefined, min: number, max: number, unit: string): void {
  if (value === undefined) return
  if (typeof value !== 'number' || !Number.isFinite(value) || value < min || value > max) {
    throw new LogImportError('BAD_OPTION', `${name} must be a number between ${min} and ${max}${unit}; got ${String(value)}.`)
  }
}

interface RangeMean {
  mean: number
  max: number
  count: number
}

/** Mean and max of finite, unmasked samples in [from, to). No allocation. */
function rangeStats(values: Float32Array | undefined, flags: Uint8Array | undefined, from: number, to: number): RangeMean {
  if (!values) return { mean: Number.NaN, max: Number.NaN, count: 0 }
  let sum = 0
  let count = 0
  let max = Number.NEGATIVE_INFINITY
  for (let i = from; i < to; i++) {
    if (flags && flags[i] !== 0) continue
    const v = values[i]!
    if (!Number.isFinite(v)) continue
    sum += v
    count++
    if (v > max) max = v
  }
  return { mean: count > 0 ? sum / count : Number.NaN, max: count > 0 ? max : Number.NaN, count }
}

/** Analyse an imported log (or bare channels plus options). */
export function analyseLog(input: LogChannels | ImportedLog, options: AnalyseOptions = {}): AnalysisResult {
  const channels = isImported(input) ? input.channels : input
  const mapping: LogMapping = options.mapping ?? (isImported(input) ? input.mapping : {})
  const warnings: AnalysisWarning[] = isImported(input) ? input.warnings.map((w: ImportWarning) => ({ ...w })) : []
  checkOption('ambientTempC', options.ambientTempC, -60, 70, ' °C')
  checkOption('altitudeM', options.altitudeM, -500, 9000, ' m')
  checkOption('baroKpa', options.baroKpa, 40, 115, ' kPa')
  checkOption('humidityPct', options.humidityPct, 0, 100, ' %')
  checkOption('ratedPowerKw', options.ratedPowerKw, 1, 5000, ' kW')
  checkOption('pullThresholdPct', options.pullThresholdPct, 1, 100, ' %')
  checkOption('pullMinDurationS', options.pullMinDurationS, 0.1, 600, ' s')
  checkOption('compressorEfficiency', options.compressorEfficiency, 0.3, 1, '')
  checkOption('projectionLossPct', options.projectionLossPct, 0.1, 50, ' %')

  const t = channels.timeS
  const n = t.length
  const charge = channels.chargeTempK
  if (!charge) {
    throw new LogImportError('NO_TEMPERATURE_COLUMN', 'The log has no charge-air temperature channel, which the analysis needs. Map the charge (or intake) air temperature column and analyse again.', { channel: 'chargeTemp' })
  }

  // Ambient: the channel when it has readings, else the value entered (option, then mapping).
  let ambientChannel = channels.ambientTempK
  if (ambientChannel && !ambientChannel.some(Number.isFinite)) ambientChannel = undefined
  const enteredAmbientK = options.ambientTempC !== undefined ? options.ambientTempC + KELVIN_OFFSET : mappedFixedValueSI(mapping, 'ambientTemp')
  if (!ambientChannel && enteredAmbientK === undefined) {
    throw new LogImportError('AMBIENT_REQUIRED', 'This log has no ambient (outside) air temperature channel. Enter the ambient temperature during the log (°C) so temperatures can be compared with it, then analyse again.', { channel: 'ambientTemp' })
  }
  const ambientSource: 'channel' | 'entered' = ambientChannel ? 'channel' : 'entered'

  // Barometric pressure for the pressure ratio: channel, entered value, or ISA at the site altitude.
  const baroChannel = channels.baroPa
  const enteredBaroPa = options.baroKpa !== undefined ? options.baroKpa * 1000 : mappedFixedValueSI(mapping, 'baro')
  let baroSource: 'channel' | 'entered' | 'isa'
  let fixedBaroPa: number
  if (baroChannel && baroChannel.some(Number.isFinite)) {
    baroSource = 'channel'
    fixedBaroPa = rangeStats(baroChannel, undefined, 0, n).mean
  }
  else if (enteredBaroPa !== undefined) {
    baroSource = 'entered'
    fixedBaroPa = enteredBaroPa
  }
  else {
    baroSource = 'isa'
    fixedBaroPa = isaPressureAtElevationPa(options.altitudeM ?? 0)
  }

  const maskResult = computeMasks(channels, ambientChannel ?? enteredAmbientK, options.masks)
  const flags = maskResult.flags
  let maskedS = 0
  for (const span of maskResult.spans) maskedS += span.endS - span.startS

  const detection = detectPulls(channels, {
    thresholdPct: options.pullThresholdPct,
    minDurationS: options.pullMinDurationS,
    channel: options.pullChannel,
    engineOffRpm: options.masks?.engineOffRpm,
  } as Partial<PullOptions>)
  const thresholdPct = options.pullThresholdPct ?? 90
  if (!detection.loadChannel) {
    warnings.push({ code: 'NO_LOAD_CHANNEL', message: 'The log has neither an accelerator pedal nor a throttle channel, so full-load pulls cannot be found. Map one, or add the pulls by hand (start and end times).' })
  }
  else if (detection.windows.length === 0 && !(options.pullEdits?.add?.length)) {
    warnings.push({
      code: 'NO_PULLS',
      message: `No full-load pulls found: the ${detection.loadChannel} reached at most ${Number.isFinite(detection.maxLoadPct) ? detection.maxLoadPct.toFixed(1) : '–'} % and a pull needs ≥ ${thresholdPct} % held for ${options.pullMinDurationS ?? 3} s. `
        + 'Log a few full-throttle pulls on a closed course or dyno, or lower the threshold if the sensor never reads 100 % at full pedal.',
    })
  }
  const windows = applyPullEdits(t, detection.windows, options.pullEdits)

  const efficiency = options.compressorEfficiency ?? DEFAULT_COMPRESSOR_EFFICIENCY
  const relativeHumidity = options.humidityPct !== undefined ? options.humidityPct / 100 : (mappedFixedValueSI(mapping, 'humidity') ?? Number.NaN) / 100
  const kept: { window: PullWindow, chargeMeanK: number, chargeMaxK: number, ambientK: number, masked: number, manifold: number, pre: number, preSource: 'measured' | 'estimated' | null, pr: number, rpm: number, speed: number }[] = []
  let noBoostPulls = 0
  for (const window of windows) {
    const { startIndex: from, endIndex: to } = window
    let masked = 0
    for (let i = from; i < to; i++) if (flags[i] !== 0) masked++
    const maskedFraction = to > from ? masked / (to - from) : 1
    const chargeStats = rangeStats(charge, flags, from, to)
    if (maskedFraction > 0.5 || chargeStats.count === 0) {
      warnings.push({ code: 'PULL_MASKED', message: `The pull at ${window.startS.toFixed(1)}–${window.endS.toFixed(1)} s lies mostly in a masked span (engine stop or sensor artefact) and was left out.` })
      continue
    }
    const ambientK = ambientChannel ? rangeStats(ambientChannel, undefined, from, to).mean : enteredAmbientK!
    const manifold = rangeStats(channels.manifoldPressurePa, flags, from, to).mean
    const baroPa = baroChannel && baroSource === 'channel' ? rangeStats(baroChannel, undefined, from, to).mean : fixedBaroPa
    const pr = Number.isFinite(manifold) && Number.isFinite(baroPa) ? manifold / baroPa : Number.NaN
    const measuredPre = rangeStats(channels.preCoolerTempK, flags, from, to).mean
    let pre = Number.NaN
    let preSource: 'measured' | 'estimated' | null = null
    if (Number.isFinite(measuredPre)) {
      pre = measuredPre
      preSource = 'measured'
    }
    else if (pr > 1.05 && Number.isFinite(ambientK)) {
      // No pre-cooler sensor: compressor outlet from the pressure ratio, inlet at ambient
      // (ideal-gas compressor relation, reference sheet §4).
      pre = compressorOutletTempK(ambientK, pr, efficiency)
      preSource = 'estimated'
    }
    else {
      noBoostPulls++
    }
    kept.push({
      window,
      chargeMeanK: chargeStats.mean,
      chargeMaxK: chargeStats.max,
      ambientK,
      masked: maskedFraction,
      manifold,
      pre,
      preSource,
      pr,
      rpm: rangeStats(channels.rpm, flags, from, to).mean,
      speed: rangeStats(channels.speedMps, flags, from, to).mean,
    })
  }
  if (noBoostPulls > 0) {
    warnings.push({ code: 'NO_BOOST', message: `${noBoostPulls} pull(s) show no boost and the log has no pre-cooler temperature, so intercooler effectiveness is not given for them.` })
  }

  let coolestK = Number.POSITIVE_INFINITY
  for (const pull of kept) if (pull.chargeMeanK < coolestK) coolestK = pull.chargeMeanK
  const rated = options.ratedPowerKw
  const pulls: PullResult[] = kept.map((pull, index) => {
    const effectiveness = pull.preSource ? intercoolerEffectiveness(pull.pre, pull.chargeMeanK, pull.ambientK) : Number.NaN
    const lossCoolest = powerLossPct(coolestK, pull.chargeMeanK, 'density')
    const lossAmbient = powerLossPct(pull.ambientK, pull.chargeMeanK, 'density')
    const dew = Number.isFinite(relativeHumidity) && Number.isFinite(pull.manifold)
      ? chargeDewPointC({ ambientPressurePa: fixedBaroPa, ambientTempK: pull.ambientK, relativeHumidity, chargePressurePa: pull.manifold })
      : Number.NaN
    return {
      index,
      startS: round(pull.window.startS, 3),
      endS: round(pull.window.endS, 3),
      durationS: round(pull.window.endS - pull.window.startS, 3),
      origin: pull.window.origin,
      autoIndex: pull.window.autoIndex,
      meanChargeTempC: round(pull.chargeMeanK - KELVIN_OFFSET, 2),
      peakChargeTempC: round(pull.chargeMaxK - KELVIN_OFFSET, 2),
      ambientTempC: round(pull.ambientK - KELVIN_OFFSET, 2),
      meanDeltaOverAmbientK: round(pull.chargeMeanK - pull.ambientK, 2),
      meanManifoldKpa: orNull(pull.manifold / 1000, 2),
      pressureRatio: orNull(pull.pr, 3),
      preCoolerTempC: orNull(pull.pre - KELVIN_OFFSET, 2),
      effectiveness: orNull(effectiveness, 4),
      effectivenessSource: Number.isFinite(effectiveness) ? pull.preSource : null,
      // σ = (p/(R·T))/1.225, dry ideal gas (reference sheet §5).
      densityRatioIsa: Number.isFinite(pull.manifold) ? round(densityRatioIsa(pull.manifold, pull.chargeMeanK), 4) : null,
      powerLossVsCoolestPct: round(lossCoolest, 3),
      powerLossVsAmbientPct: round(lossAmbient, 3),
      powerLossVsCoolestKw: rated !== undefined ? round(rated * lossCoolest / 100, 2) : null,
      powerLossVsAmbientKw: rated !== undefined ? round(rated * lossAmbient / 100, 2) : null,
      meanRpm: orNull(pull.rpm, 0),
      meanSpeedKmh: orNull(pull.speed * 3.6, 1),
      maskedFraction: round(pull.masked, 3),
      chargeDewPointC: orNull(dew, 2),
    }
  })
  for (const pull of pulls) {
    if (pull.chargeDewPointC !== null && pull.meanChargeTempC < pull.chargeDewPointC) {
      warnings.push({ code: 'CONDENSATION', message: `Pull ${pull.index + 1}: the charge air (${pull.meanChargeTempC.toFixed(1)} °C) is below its dew point at this boost (${pull.chargeDewPointC.toFixed(1)} °C): water can condense in the intercooler.` })
    }
  }

  const means = kept.map(p => p.chargeMeanK - KELVIN_OFFSET)
  const trend = soakTrend(means)
  const recovery = recoveryTimeConstant(t, charge, flags, kept.map(p => p.window))
  const effectivenessValues = pulls.map(p => p.effectiveness).filter((v): v is number => v !== null)
  const sources = new Set(pulls.map(p => p.effectivenessSource).filter(s => s !== null))
  const ambientMeanK = ambientChannel ? rangeStats(ambientChannel, undefined, 0, n).mean : enteredAmbientK!
  const chargeTempRiseK = kept.length >= 2 ? kept[kept.length - 1]!.chargeMeanK - kept[0]!.chargeMeanK : Number.NaN
  const maxOf = (values: number[]) => (values.length ? Math.max(...values) : Number.NaN)

  if (sources.has('estimated')) {
    warnings.push({ code: 'EFFECTIVENESS_ESTIMATED', message: `No pre-cooler temperature in the log: the compressor outlet temperature was estimated from the pressure ratio with an isentropic efficiency of ${efficiency.toFixed(2)}, so effectiveness is an estimate.` })
  }
  if (baroSource === 'isa' && kept.some(p => p.preSource === 'estimated')) {
    warnings.push({ code: 'BARO_FROM_ISA', message: `No barometric pressure in the log or entered: ISA pressure at ${options.altitudeM ?? 0} m (${(fixedBaroPa / 1000).toFixed(2)} kPa) was used for the pressure ratio.` })
  }

  const summary: AnalysisSummary = {
    pullCount: pulls.length,
    peakChargeTempC: orNull(maxOf(pulls.map(p => p.peakChargeTempC)), 2),
    maxPowerLossVsCoolestPct: orNull(maxOf(pulls.map(p => p.powerLossVsCoolestPct)), 3),
    maxPowerLossVsAmbientPct: orNull(maxOf(pulls.map(p => p.powerLossVsAmbientPct)), 3),
    maxPowerLossVsCoolestKw: rated !== undefined ? orNull(maxOf(pulls.map(p => p.powerLossVsCoolestKw ?? Number.NaN)), 2) : null,
    soakIndexKPerPull: trend.soakIndexKPerPull === null ? null : round(trend.soakIndexKPerPull, 3),
    soakFitR2: trend.soakFitR2 === null ? null : round(trend.soakFitR2, 3),
    chargeTempRiseK: orNull(chargeTempRiseK, 2),
    recoveryTimeConstantS: recovery.recoveryTimeConstantS === null ? null : round(recovery.recoveryTimeConstantS, 1),
    projection: projectPullsUntilLoss(trend, Number.isFinite(coolestK) ? coolestK - KELVIN_OFFSET : Number.NaN, pulls.length, options.projectionLossPct ?? 5),
    meanEffectiveness: effectivenessValues.length ? round(effectivenessValues.reduce((a, b) => a + b, 0) / effectivenessValues.length, 4) : null,
    effectivenessSource: sources.has('measured') ? 'measured' : sources.has('estimated') ? 'estimated' : null,
    meanDeltaOverAmbientK: pulls.length ? round(pulls.reduce((a, p) => a + p.meanDeltaOverAmbientK, 0) / pulls.length, 2) : null,
    ambientTempC: orNull(ambientMeanK - KELVIN_OFFSET, 2),
    ambientSource,
    baroKpa: round(fixedBaroPa / 1000, 2),
    baroSource,
    pullChannel: detection.loadChannel,
    pullThresholdPct: thresholdPct,
    maxLoadPct: orNull(detection.maxLoadPct, 1),
    durationS: n > 0 ? round(t[n - 1]!, 3) : 0,
    sampleCount: n,
    maskedS: round(maskedS, 1),
    compressorEfficiency: efficiency,
    powerLossBasis: 'Density law (ideal gas) at equal boost, air-limited engine: an upper bound on the power change; real engines are partly compensated.',
  }
  return { summary, pulls, masks: maskResult.spans.map(s => ({ ...s, startS: round(s.startS, 3), endS: round(s.endS, 3) })), warnings, mapping }
}
