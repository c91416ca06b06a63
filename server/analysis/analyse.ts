// From canonical channels to the analysis JSON of issue 3:
// { summary, pulls, masks, warnings, mapping }. SI inside; °C, kPa and % only in named output fields.
import { isaPressureAtElevationPa } from './atmosphere'
import type { LogChannels } from '../../shared/quantities/channels'
import { compressorOutletTempK, DEFAULT_COMPRESSOR_EFFICIENCY } from './compressor'
import { KELVIN_OFFSET } from './constants'
import { fromSI } from '../../shared/quantities/units'
import { chargeDewPointC, densityRatioIsa } from './density'
import { intercoolerEffectiveness } from './effectiveness'
import { LogImportError } from './import/errors'
import type { ImportedLog, ImportWarning } from './import/importer'
import { mappedFixedValueSI } from './import/importer'
import type { LogMapping } from './import/mapping'
import { driveSummary } from './drive'
import type { DriveDetail, DriveSummary } from './drive'
import { computeMasks, MASK_BIT } from './masks'
import type { MaskOptions, MaskReason, MaskSpan } from './masks'
import { powerLossPct } from './power'
import { applyPullEdits, detectPulls } from './pulls'
import type { FullLoadRule, PullEdits, PullKind, PullOrigin, PullWindow } from './pulls'
import { normalisedChargeTempK, projectPullsUntilLoss, recoveryTimeConstant, soakTrend } from './soak'
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
  /** Pull threshold, %: sets the full-load rule by hand (default: chosen automatically, see pulls.ts). */
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
  /** A hard acceleration, or a sustained pull (a long stretch at high boost). */
  kind: PullKind
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
  /** Charge dew point at the pull's boost, °C (only with humidity, entered or logged). */
  chargeDewPointC: number | null
  /** Charge temperature at the log's reference ambient and boost (see `lossNormalisation`), °C. */
  normalisedChargeTempC: number
  /** Channels that sat at the end of their range during the pull (no density figure from them). */
  clipped: string[]
  /** The pull lay mostly in a stretch left out for a sensor fault and was kept because the user asked. */
  keptDespiteLeftOut: boolean
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
  /** Measured effectiveness when any pull has a pre-cooler sensor, else the estimated one; never a mix. */
  meanEffectiveness: number | null
  effectivenessSource: 'measured' | 'estimated' | null
  /** Mean effectiveness of the pulls with a pre-cooler sensor. */
  meanEffectivenessMeasured: number | null
  measuredPullCount: number
  /** Mean effectiveness of the pulls where the pre-cooler temperature was estimated (reads low). */
  meanEffectivenessEstimated: number | null
  estimatedPullCount: number
  /** How "power lost against the coolest pull" was made fair between pulls (ambient drift, boost differences). */
  lossNormalisation: { method: 'ambient-and-boost' | 'ambient', referenceAmbientC: number | null, referencePressureRatio: number | null, note: string }
  /** The full-load rule that found the pulls. */
  fullLoadRule: FullLoadRule
  /** Pulls the rule found, before any were left out for a sensor fault. */
  foundPullCount: number
  /** Pulls left out because they lay mostly in a stretch left out (engine stop, sensor fault). */
  leftOutPulls: { startS: number, endS: number, reasons: MaskReason[] }[]
  /** Where the relative humidity came from (logged channel, entered value, or none). */
  humiditySource: 'channel' | 'entered' | null
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
  /** Heat soak across the whole drive, with or without pulls (issue 10 contract). */
  drive: DriveSummary
  driveDetail: DriveDetail
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

const REASON_WORDS: Record<MaskReason, string> = {
  'engine-off': 'engine stopped',
  'restart-settle': 'settling after a restart',
  'sensor-dropout': 'temperature sensor gave no reading',
  'temp-spike': 'single-reading jumps of the charge temperature with no boost change to explain them',
  'temp-step': 'charge temperature steps with no boost change to explain them',
  'below-ambient': 'charge temperature read below ambient',
  'clipped': 'sensor at the end of its range',
}

/** Flags keeping only the bits that always keep a sample out (for a pull kept at the user's request). */
function hardMask(flags: Uint8Array, bits: number, from: number, to: number): Uint8Array {
  const out = new Uint8Array(flags.length)
  for (let i = from; i < to; i++) out[i] = flags[i]! & bits
  return out
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
    throw new LogImportError('AMBIENT_REQUIRED', 'This log has no ambient temperature column. Enter the ambient temperature during the pulls (°C), so the charge temperature can be compared with it, and upload the log again.', { channel: 'ambientTemp' })
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
    // The importer fills baro from ISA at the site altitude when a gauge boost column needs one:
    // that is the standard atmosphere, not a value anyone entered.
    baroSource = options.baroKpa === undefined && mapping.baro?.source === 'isa' ? 'isa' : 'entered'
    fixedBaroPa = enteredBaroPa
  }
  else {
    baroSource = 'isa'
    fixedBaroPa = isaPressureAtElevationPa(options.altitudeM ?? 0)
  }

  const maskResult = computeMasks(channels, ambientChannel ?? enteredAmbientK, options.masks)
  const flags = maskResult.flags
  const clipped = maskResult.clipped
  let maskedS = 0
  for (const span of maskResult.spans) if (span.reason !== 'clipped') maskedS += span.endS - span.startS

  const edits = options.pullEdits
  const rule = edits?.rule
  const detection = detectPulls(channels, {
    thresholdPct: options.pullThresholdPct ?? rule?.thresholdPct,
    minDurationS: options.pullMinDurationS,
    channel: options.pullChannel ?? rule?.channel,
    engineOffRpm: options.masks?.engineOffRpm,
    baroPa: fixedBaroPa,
    sustained: rule?.sustained ?? true,
  })
  if (!detection.loadChannel && detection.rule.mode !== 'boost') {
    warnings.push({ code: 'NO_LOAD_CHANNEL', message: 'The log has neither an accelerator pedal nor a throttle channel, nor boost, so pulls cannot be found. Upload the log again with one of them chosen in the column form, or zoom the chart to each pull and choose "Count this window as a pull".' })
  }
  else if (detection.windows.length === 0 && !(edits?.add?.length)) {
    const top = Number.isFinite(detection.maxLoadPct) ? `${detection.maxLoadPct.toFixed(1)} %` : '–'
    warnings.push({
      code: 'NO_PULLS',
      message: `No pulls found with the full-load rule (${detection.rule.description}); the ${detection.loadChannel ?? 'load'} reached at most ${top}, and a pull needs it held for ${options.pullMinDurationS ?? 3} s. `
        + 'If the car logs full load differently, set the rule by hand in the Full-load rule card, or zoom the chart to each pull and choose "Count this window as a pull".',
    })
  }
  const windows = applyPullEdits(t, detection.windows, edits)

  const efficiency = options.compressorEfficiency ?? DEFAULT_COMPRESSOR_EFFICIENCY
  const humidityChannel = channels.humidityPct && channels.humidityPct.some(Number.isFinite) ? channels.humidityPct : undefined
  const enteredHumidity = options.humidityPct !== undefined ? options.humidityPct / 100 : (mappedFixedValueSI(mapping, 'humidity') ?? Number.NaN) / 100
  const humiditySource: AnalysisSummary['humiditySource'] = humidityChannel ? 'channel' : Number.isFinite(enteredHumidity) ? 'entered' : null
  // What keeps a sample out of a pull's figures. Kept pulls ("keep them") still never use a stop,
  // the settling after it, or a sensor's no-reading value.
  const hardBits = MASK_BIT['engine-off'] | MASK_BIT['restart-settle'] | MASK_BIT['sensor-dropout']
  const keepLeftOut = edits?.keepLeftOut === true
  const kept: { window: PullWindow, chargeMeanK: number, chargeMaxK: number, ambientK: number, masked: number, manifold: number, pre: number, preSource: 'measured' | 'estimated' | null, pr: number, rpm: number, speed: number, humidity: number, clipped: string[], keptDespite: boolean }[] = []
  const leftOutPulls: AnalysisSummary['leftOutPulls'] = []
  let noBoostPulls = 0
  for (const window of windows) {
    const { startIndex: from, endIndex: to } = window
    let masked = 0
    let hard = 0
    const reasonBits = new Set<number>()
    let clippedBits = 0
    for (let i = from; i < to; i++) {
      if (flags[i] !== 0) {
        masked++
        reasonBits.add(flags[i]!)
      }
      if (flags[i]! & hardBits) hard++
      clippedBits |= clipped[i]!
    }
    const span = Math.max(1, to - from)
    const maskedFraction = to > from ? masked / span : 1
    const softOnly = hard / span <= 0.5
    const keptDespite = keepLeftOut && maskedFraction > 0.5 && softOnly
    const use = keptDespite ? hardMask(flags, hardBits, from, to) : flags
    const chargeStats = rangeStats(charge, use, from, to)
    if ((maskedFraction > 0.5 && !keptDespite) || chargeStats.count === 0) {
      const reasons = new Set<MaskReason>()
      for (const bits of reasonBits) for (const [reason, bit] of Object.entries(MASK_BIT) as [MaskReason, number][]) if (bits & bit) reasons.add(reason)
      leftOutPulls.push({ startS: round(window.startS, 3), endS: round(window.endS, 3), reasons: [...reasons] })
      warnings.push({ code: 'PULL_MASKED', message: `The pull at ${window.startS.toFixed(1)}–${window.endS.toFixed(1)} s lies mostly in a stretch left out (${[...reasons].map(r => REASON_WORDS[r]).join(', ')}) and was not counted.` })
      continue
    }
    const ambientK = ambientChannel ? rangeStats(ambientChannel, undefined, from, to).mean : enteredAmbientK!
    const clippedChannels = [...(clippedBits & 1 ? ['manifoldPressure'] : []), ...(clippedBits & 2 ? ['massAirFlow'] : [])]
    // A clipped manifold pressure is not a reading: no pressure ratio, density or estimated
    // pre-cooler temperature is worked out from it.
    const manifold = clippedBits & 1 ? Number.NaN : rangeStats(channels.manifoldPressurePa, use, from, to).mean
    const baroPa = baroChannel && baroSource === 'channel' ? rangeStats(baroChannel, undefined, from, to).mean : fixedBaroPa
    const pr = Number.isFinite(manifold) && Number.isFinite(baroPa) ? manifold / baroPa : Number.NaN
    const measuredPre = rangeStats(channels.preCoolerTempK, use, from, to).mean
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
    else if (!(clippedBits & 1)) {
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
      rpm: rangeStats(channels.rpm, use, from, to).mean,
      speed: rangeStats(channels.speedMps, use, from, to).mean,
      humidity: humidityChannel ? rangeStats(humidityChannel, undefined, from, to).mean / 100 : enteredHumidity,
      clipped: clippedChannels,
      keptDespite,
    })
  }
  if (noBoostPulls > 0) {
    warnings.push({ code: 'NO_BOOST', message: `${noBoostPulls === 1 ? '1 pull shows' : `${noBoostPulls} pulls show`} no boost and the log has no pre-cooler temperature, so intercooler effectiveness is not given for them.` })
  }
  const clippedPulls = kept.filter(p => p.clipped.length > 0).length
  if (maskResult.spans.some(s => s.reason === 'clipped')) {
    const which = [...new Set(maskResult.spans.filter(s => s.reason === 'clipped').map(s => s.channel === 'massAirFlow' ? 'air mass flow' : 'manifold pressure'))].join(' and ')
    warnings.push({
      code: 'SENSOR_CLIPPED',
      channel: 'manifoldPressure',
      message: `The ${which} sensor sat at the end of its range in ${maskResult.spans.filter(s => s.reason === 'clipped').length} stretch(es)${clippedPulls ? `, ${clippedPulls} of them during pulls` : ''}: the real value was higher. No density ratio or estimated effectiveness is worked out from a clipped reading. A wider-range sensor is needed to measure this car.`,
    })
  }
  const foundPullCount = windows.length
  if (leftOutPulls.length > 0 && leftOutPulls.length * 2 > foundPullCount) {
    const reasons = [...new Set(leftOutPulls.flatMap(p => p.reasons))]
    warnings.unshift({
      code: 'MOST_PULLS_LEFT_OUT',
      message: `${leftOutPulls.length} of the ${foundPullCount} pulls found were left out (${reasons.map(r => REASON_WORDS[r]).join(', ')}). If you trust the sensor there, keep them.`,
    })
  }

  // Loss against the coolest pull, made fair: each pull's charge temperature is restated at one
  // reference ambient and pressure ratio, keeping the share of the compressor's heat its core did
  // not remove (1 − effectiveness, reference sheet §5; compressor heat from §4). Ambient drift then
  // does not count as heat soak, nor does a pull at lower boost look "cooler" only because the
  // compressor added less heat.
  const ambients = kept.map(p => p.ambientK)
  const refAmbientK = ambients.length ? ambients.reduce((a, b) => a + b, 0) / ambients.length : Number.NaN
  const ratios = kept.map(p => p.pr).filter(v => v > 1.05).sort((a, b) => a - b)
  const allBoosted = ratios.length > 0 && ratios.length === kept.length
  const refPr = allBoosted ? ratios[ratios.length >> 1]! : Number.NaN
  const normalised = kept.map(p => normalisedChargeTempK({ chargeK: p.chargeMeanK, ambientK: p.ambientK, pressureRatio: allBoosted ? p.pr : Number.NaN, refAmbientK, refPressureRatio: refPr, efficiency }))
  const lossNormalisation: AnalysisSummary['lossNormalisation'] = allBoosted
    ? { method: 'ambient-and-boost', referenceAmbientC: round(refAmbientK - KELVIN_OFFSET, 2), referencePressureRatio: round(refPr, 3), note: `Each pull's charge temperature is restated at the pulls' mean ambient (${(refAmbientK - KELVIN_OFFSET).toFixed(1)} °C) and median pressure ratio (${refPr.toFixed(2)}), keeping the share of the compressor's heat that its intercooler did not remove; so neither a change in the weather nor a pull at lower boost counts as heat soak.` }
    : { method: 'ambient', referenceAmbientC: Number.isFinite(refAmbientK) ? round(refAmbientK - KELVIN_OFFSET, 2) : null, referencePressureRatio: null, note: `Each pull's charge temperature is compared as temperature over ambient, restated at the pulls' mean ambient${Number.isFinite(refAmbientK) ? ` (${(refAmbientK - KELVIN_OFFSET).toFixed(1)} °C)` : ''}, so a change in the weather does not count as heat soak${ratios.length ? '; boost was not usable on every pull, so boost differences are not allowed for' : ''}.` }

  let coolestK = Number.POSITIVE_INFINITY
  for (const value of normalised) if (value < coolestK) coolestK = value
  const rated = options.ratedPowerKw
  const pulls: PullResult[] = kept.map((pull, index) => {
    const effectiveness = pull.preSource ? intercoolerEffectiveness(pull.pre, pull.chargeMeanK, pull.ambientK) : Number.NaN
    // Density law at equal boost (reference sheet §7) on the restated temperatures.
    const lossCoolest = powerLossPct(coolestK, normalised[index]!, 'density')
    const lossAmbient = powerLossPct(pull.ambientK, pull.chargeMeanK, 'density')
    const dew = Number.isFinite(pull.humidity) && Number.isFinite(pull.manifold)
      ? chargeDewPointC({ ambientPressurePa: fixedBaroPa, ambientTempK: pull.ambientK, relativeHumidity: pull.humidity, chargePressurePa: pull.manifold })
      : Number.NaN
    return {
      index,
      startS: round(pull.window.startS, 3),
      endS: round(pull.window.endS, 3),
      durationS: round(pull.window.endS - pull.window.startS, 3),
      origin: pull.window.origin,
      autoIndex: pull.window.autoIndex,
      kind: pull.window.kind,
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
      meanSpeedKmh: orNull(fromSI(pull.speed, 'km/h'), 1),
      maskedFraction: round(pull.masked, 3),
      chargeDewPointC: orNull(dew, 2),
      normalisedChargeTempC: round(normalised[index]! - KELVIN_OFFSET, 2),
      clipped: pull.clipped,
      keptDespiteLeftOut: pull.keptDespite,
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
  const meanOf = (values: number[]) => (values.length ? round(values.reduce((a, b) => a + b, 0) / values.length, 4) : null)
  const measuredValues = pulls.filter(p => p.effectivenessSource === 'measured').map(p => p.effectiveness!)
  const estimatedValues = pulls.filter(p => p.effectivenessSource === 'estimated').map(p => p.effectiveness!)
  const ambientMeanK = ambientChannel ? rangeStats(ambientChannel, undefined, 0, n).mean : enteredAmbientK!
  const chargeTempRiseK = kept.length >= 2 ? kept[kept.length - 1]!.chargeMeanK - kept[0]!.chargeMeanK : Number.NaN
  const maxOf = (values: number[]) => (values.length ? Math.max(...values) : Number.NaN)

  if (estimatedValues.length > 0) {
    // Reference sheet §13, last bullet: the estimate ignores the cooler's pressure drop, inlet
    // restriction and under-bonnet inlet heating; a 10 kPa drop at 220 kPa alone adds 6–7 K to the
    // real compressor outlet temperature and about 0.01 to effectiveness (COMPUTED there).
    warnings.push({ code: 'EFFECTIVENESS_ESTIMATED', message: `No pre-cooler temperature in the log: the pre-cooler temperature was estimated from the pressure ratio with an isentropic efficiency of ${efficiency.toFixed(2)}, so effectiveness is an estimate. It reads low: the estimate leaves out the intercooler's pressure drop and the heating of the air before the turbo, so the real pre-cooler temperature is higher — a 10 kPa drop at 220 kPa alone adds about 6–7 K, or about 0.01 of effectiveness, and under-bonnet inlet heating adds more; read it as roughly 0.01–0.05 low.` })
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
    meanEffectiveness: meanOf(measuredValues) ?? meanOf(estimatedValues),
    effectivenessSource: measuredValues.length ? 'measured' : estimatedValues.length ? 'estimated' : null,
    meanEffectivenessMeasured: meanOf(measuredValues),
    measuredPullCount: measuredValues.length,
    meanEffectivenessEstimated: meanOf(estimatedValues),
    estimatedPullCount: estimatedValues.length,
    lossNormalisation,
    fullLoadRule: detection.rule,
    foundPullCount,
    leftOutPulls,
    humiditySource,
    meanDeltaOverAmbientK: pulls.length ? round(pulls.reduce((a, p) => a + p.meanDeltaOverAmbientK, 0) / pulls.length, 2) : null,
    ambientTempC: orNull(ambientMeanK - KELVIN_OFFSET, 2),
    ambientSource,
    baroKpa: round(fixedBaroPa / 1000, 2),
    baroSource,
    pullChannel: detection.loadChannel,
    pullThresholdPct: detection.rule.thresholdPct ?? options.pullThresholdPct ?? 90,
    maxLoadPct: orNull(detection.maxLoadPct, 1),
    durationS: n > 0 ? round(t[n - 1]!, 3) : 0,
    sampleCount: n,
    maskedS: round(maskedS, 1),
    compressorEfficiency: efficiency,
    powerLossBasis: 'Density law (ideal gas) at equal boost, air-limited engine: an upper bound on the power change; real engines are partly compensated.',
  }
  const { drive, detail: driveDetail } = driveSummary({ channels, flags, ambientK: ambientChannel ?? enteredAmbientK!, baroPa: fixedBaroPa, engineOffRpm: options.masks?.engineOffRpm ?? 300 })
  if (drive.soakEvents.length > 0) {
    const worst = drive.soakEvents.reduce((a, b) => (b.riseK > a.riseK ? b : a))
    warnings.push({ code: 'SOAK_EVENTS', message: `${drive.soakEvents.length} soak event(s): the charge temperature climbed while the car was slow or stopped, by up to ${worst.riseK.toFixed(1)} K (at ${worst.startS.toFixed(0)}–${worst.endS.toFixed(0)} s).` })
  }
  return { summary, drive, driveDetail, pulls, masks: maskResult.spans.map(s => ({ ...s, startS: round(s.startS, 3), endS: round(s.endS, 3) })), warnings, mapping }
}
