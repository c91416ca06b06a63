// The plain-language verdict at the top of a report: worded for the driver, with the exact
// figures a tuner wants underneath. Thresholds are our own workshop judgement (common practice,
// no source): under ~1.5 % power lost between the coolest and hottest pull a driver will not feel
// it; past ~4 % it shows on a dyno sheet and in the seat.
import { displaySymbol, toDisplay, type DisplayPowerUnit, type DisplayTemperatureUnit } from '#shared/quantities/display'
import type { AnalysisResult, LogVehicle } from '#shared/types/report'
import { formatFixed } from '#shared/utils/format'
import { formatTemperatureDifference } from './displayUnits'

export type VerdictLevel = 'good' | 'fair' | 'poor' | 'unknown'

export interface Verdict {
  level: VerdictLevel
  /** One line a driver reads first. */
  headline: string
  /** What happened, in numbers a driver can follow. */
  summary: string
  /** What it means for the car. */
  meaning: string
  /** What to consider next. */
  consider: string[]
  /** Exact figures for the tuner. */
  facts: { label: string, value: string }[]
  /** What the estimate assumes. */
  assumptions: string
  /** Heat soak over the whole drive and the soak events, in plain words (null without a drive summary). */
  drive: string | null
  /** Most pulls were left out for a sensor fault: the report offers to keep them. */
  offerKeepLeftOut: boolean
}

export const VERDICT_THRESHOLDS = {
  /** Max power lost vs the coolest pull below which the core is judged to hold up, %. */
  goodLossPct: 1.5,
  /** Above this the soak is judged heavy, %. */
  poorLossPct: 4,
  /** Charge air this far above ambient on average is a lot for a working intercooler, K (common practice, no source). */
  highDeltaK: 25,
  /** Effectiveness below this is low for an air-to-air core at full load. */
  lowEffectiveness: 0.6,
} as const

export interface VerdictUnits {
  temperature: DisplayTemperatureUnit
  power: DisplayPowerUnit
}

const pct = (value: number, digits = 1) => `${formatFixed(value, digits)} %`
function powerText(kw: number, unit: DisplayPowerUnit): string {
  const shown = toDisplay(kw, 'power', unit)
  return `${formatFixed(shown, shown < 10 ? 1 : 0)} ${displaySymbol('power', unit)}`
}
const pullWord = (n: number) => (n === 1 ? 'pull' : 'pulls')
const NUMBER_WORDS = ['no', 'one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine', 'ten', 'eleven', 'twelve']
const count = (n: number) => NUMBER_WORDS[n] ?? String(n)
const minutes = (s: number) => (s < 90 ? `${Math.round(s)} s` : `${Math.round(s / 60)} min`)

const REASON_PLAIN: Record<string, string> = {
  'engine-off': 'the engine was stopped',
  'restart-settle': 'the sensor was settling after a restart',
  'sensor-dropout': 'the temperature sensor gave no reading',
  'temp-spike': 'the charge temperature jumped with no change in boost to explain it',
  'temp-step': 'the charge temperature jumped with no change in boost to explain it',
  'below-ambient': 'the charge temperature read colder than the ambient temperature',
  'clipped': 'a sensor sat at the end of its range',
}

/** The drive's heat soak in plain words: temperature over ambient while moving, and the soak events. */
export function driveWords(analysis: AnalysisResult, t: DisplayTemperatureUnit): string | null {
  const drive = analysis.drive
  if (!drive || !drive.deltaOverAmbientK) return null
  const d = drive.deltaOverAmbientK
  const moving = analysis.driveDetail?.basis === 'running' ? 'While the engine ran' : 'While moving'
  const parts = [`${moving}, the charge air sat ${formatTemperatureDifference(d.median, t)} above the ambient temperature most of the time (${formatTemperatureDifference(d.p95, t)} or less for 95 % of it, ${formatTemperatureDifference(d.max, t)} at most).`]
  if (drive.deltaOverAmbientUnderBoostK) parts.push(`Under boost (${minutes(drive.boostedS)} of the drive) it sat ${formatTemperatureDifference(drive.deltaOverAmbientUnderBoostK.median, t)} above.`)
  const events = drive.soakEvents
  if (events.length > 0) {
    const worst = events.reduce((a, b) => (b.riseK > a.riseK ? b : a))
    const recoveries = events.map(e => e.recoveryS).filter((v): v is number => v != null).sort((a, b) => a - b)
    const recovery = recoveries.length ? ` Once moving again it took about ${minutes(recoveries[recoveries.length >> 1]!)} to come back down.` : ' It did not come back down within the log.'
    parts.push(`Heat soak in traffic: ${events.length === 1 ? 'once' : `${count(events.length)} times`} the charge air heated up while the car was slow or stopped, by up to ${formatTemperatureDifference(worst.riseK, t)}.${recovery}`)
  }
  else if (analysis.driveDetail?.hasSpeed) {
    parts.push('The charge air did not heat up noticeably while the car was slow or stopped.')
  }
  return parts.join(' ')
}

export function verdictFor(analysis: AnalysisResult, vehicle: Pick<LogVehicle, 'ratedPowerKw' | 'fuel'> | null, units: VerdictUnits = { temperature: 'C', power: 'kW' }): Verdict {
  const { summary, pulls } = analysis
  const t = units.temperature
  const normalised = summary.lossNormalisation ? ` To compare pulls fairly, ${summary.lossNormalisation.note.charAt(0).toLowerCase()}${summary.lossNormalisation.note.slice(1)}` : ''
  const assumptions = `These figures assume an air-limited engine at the same boost: power is taken to follow charge-air density (hotter air is thinner). That is an upper bound — engine management often makes up part of it.${normalised} ${summary.ambientSource === 'entered' ? 'The ambient temperature was entered by hand, not logged.' : ''}`.trim()
  const drive = driveWords(analysis, t)
  const found = summary.foundPullCount ?? summary.pullCount
  const leftOut = summary.leftOutPulls ?? []
  const mostLeftOut = leftOut.length > 0 && leftOut.length * 2 > found
  const leftOutSentence = mostLeftOut
    ? `${leftOut.length} of the ${found} pulls found were left out, because ${[...new Set(leftOut.flatMap(p => p.reasons.map(r => REASON_PLAIN[r] ?? r)))].join(' and ')}.`
    : ''
  const effectivenessFact = (value: number | null | undefined) => (value == null ? '—' : `${formatFixed(value * 100, 0)} %`)
  const facts: Verdict['facts'] = [
    { label: 'Pulls analysed', value: String(summary.pullCount) },
    { label: 'Charge-air rise, first to last pull', value: formatTemperatureDifference(summary.chargeTempRiseK, t) },
    { label: 'Soak per pull', value: summary.soakIndexKPerPull == null ? '—' : `${formatTemperatureDifference(summary.soakIndexKPerPull, t, 2)} per pull${summary.soakFitR2 == null ? '' : ` (fit R² ${summary.soakFitR2.toFixed(2)})`}` },
    { label: 'Mean temperature over ambient', value: formatTemperatureDifference(summary.meanDeltaOverAmbientK, t) },
    { label: 'Full-load rule', value: summary.fullLoadRule ? `${summary.fullLoadRule.description}${summary.fullLoadRule.source === 'by hand' ? '' : ' (chosen automatically)'}` : '—' },
    ...(summary.measuredPullCount || summary.estimatedPullCount
      ? [
          ...(summary.measuredPullCount ? [{ label: `Effectiveness, measured (${summary.measuredPullCount} ${pullWord(summary.measuredPullCount)})`, value: effectivenessFact(summary.meanEffectivenessMeasured) }] : []),
          ...(summary.estimatedPullCount ? [{ label: `Effectiveness, estimated (${summary.estimatedPullCount} ${pullWord(summary.estimatedPullCount)}; reads low)`, value: effectivenessFact(summary.meanEffectivenessEstimated) }] : []),
        ]
      : [{ label: 'Mean effectiveness', value: summary.meanEffectiveness == null ? '—' : `${formatFixed(summary.meanEffectiveness * 100, 0)} %${summary.effectivenessSource === 'estimated' ? ' (estimated)' : ''}` }]),
    { label: 'Most power lost vs coolest pull', value: summary.maxPowerLossVsCoolestPct == null ? '—' : pct(summary.maxPowerLossVsCoolestPct) },
  ]
  if (summary.recoveryTimeConstantS != null) facts.push({ label: 'Core recovery time', value: `${summary.recoveryTimeConstantS.toFixed(0)} s` })
  const sustained = pulls.filter(p => p.kind === 'sustained').length
  if (sustained > 0) facts.push({ label: 'Sustained pulls (long stretches at high boost)', value: String(sustained) })

  if (mostLeftOut) {
    return {
      level: 'unknown',
      headline: `Most pulls were left out: ${leftOutSentence.charAt(0).toLowerCase()}${leftOutSentence.slice(1)}`,
      summary: summary.pullCount > 0
        ? `The figures below come from the ${count(summary.pullCount)} ${pullWord(summary.pullCount)} that remain.`
        : 'No pull remains to judge the intercooler by.',
      meaning: 'A reading can jump like that when a sensor or its wiring is at fault — or when a fast sensor is reading real air. If you trust the sensor there, keep those pulls and the report is worked out again with them.',
      consider: ['Check the charge-air sensor and its plug, then log again; or keep the pulls if the readings are real.'],
      facts,
      assumptions,
      drive,
      offerKeepLeftOut: true,
    }
  }

  if (summary.pullCount === 0) {
    return {
      level: 'unknown',
      headline: drive ? 'No pulls found — here is how the charge air did over the drive' : 'No pulls found in this log',
      summary: drive ?? 'The log was read, but it has no stretch at full load held long enough to judge the intercooler.',
      meaning: 'Heat soak from pull to pull shows over several hard pulls in a row; this log has none, so only the drive as a whole is judged.',
      consider: [
        'Record a new log with four to six pulls on a dyno or closed course, with short gaps between them.',
        'If the pulls are in this log, a tuner can set the full-load rule by hand in the Full-load rule card, or zoom the chart to a pull and count that window as a pull.',
      ],
      facts,
      assumptions,
      drive: null,
      offerKeepLeftOut: false,
    }
  }

  const loss = summary.maxPowerLossVsCoolestPct ?? 0
  const rise = summary.chargeTempRiseK
  const delta = summary.meanDeltaOverAmbientK
  const lossKw = summary.maxPowerLossVsCoolestKw ?? (vehicle?.ratedPowerKw ? vehicle.ratedPowerKw * loss / 100 : null)
  const lossWithPower = lossKw != null && lossKw > 0 ? `${pct(loss)} (about ${powerText(lossKw, units.power)})` : pct(loss)

  if (summary.pullCount === 1) {
    const single = pulls[0]
    return {
      level: 'unknown',
      headline: 'One pull: not enough to judge heat soak from pull to pull',
      summary: `In the one pull found, the charge air sat ${formatTemperatureDifference(single?.meanDeltaOverAmbientK ?? delta, t)} above the ambient temperature.`,
      meaning: 'Heat soak is the climb from pull to pull; it takes at least two pulls, better four to six, to see it.',
      consider: ['Record several pulls in a row on a dyno or closed course and upload that log.'],
      facts,
      assumptions,
      drive,
      offerKeepLeftOut: false,
    }
  }

  const level: VerdictLevel = loss < VERDICT_THRESHOLDS.goodLossPct ? 'good' : loss < VERDICT_THRESHOLDS.poorLossPct ? 'fair' : 'poor'
  const n = summary.pullCount
  const climbed = rise == null
    ? ''
    : rise >= 0.5
      ? `Over ${count(n)} ${pullWord(n)} the charge air climbed ${formatTemperatureDifference(rise, t)} from the first to the last pull`
      : `Over ${count(n)} ${pullWord(n)} the charge air stayed steady (${formatTemperatureDifference(rise, t)} from the first to the last pull)`
  const summaryText = `${climbed}, and the hottest pull made about ${lossWithPower} less power than the coolest.`

  const headline = {
    good: 'The intercooler holds up well',
    fair: 'Some heat soak: the car loses a little power pull after pull',
    poor: 'Heavy heat soak: the car loses noticeable power as it heats up',
    unknown: '',
  }[level]
  const meaning = {
    good: 'Repeated hard pulls cost very little power; you are unlikely to feel any difference.',
    fair: 'On a track day or a long climb the car will feel a little flatter after a few pulls, and recover once it cools down.',
    poor: 'After a few hard pulls the car makes clearly less power; a dyno run or a lap late in a session will be slower than the first.',
    unknown: '',
  }[level]

  // Two separate questions, told as one story: heat soak is the climb across the pulls; the
  // temperature over ambient is how warm the charge air runs on each pull, soak or not.
  const highDelta = delta != null && delta > VERDICT_THRESHOLDS.highDeltaK
  const consider: string[] = []
  if (level === 'good' && !highDelta) consider.push('No heat soak to speak of across the pulls: no change needed. Keep this log as the reference for later comparisons.')
  if (level === 'good' && highDelta) {
    const everyPull = pulls.every(p => p.meanDeltaOverAmbientK != null && p.meanDeltaOverAmbientK > VERDICT_THRESHOLDS.highDeltaK)
    consider.push(`No heat soak to speak of across the pulls, but the charge air runs ${formatTemperatureDifference(delta, t)} above the ambient temperature ${everyPull ? 'on every pull' : 'on average'}: a larger core, or better air flow to it (ducting, no blocked grille), would lower that. More than ${formatTemperatureDifference(VERDICT_THRESHOLDS.highDeltaK, t, 0)} over ambient is a lot for a working intercooler (common practice, no source); ask the workshop whether a change would pay off.`)
  }
  if (level !== 'good') consider.push('Give the car more time between hard pulls; the charge air recovers as the core cools.')
  if (level !== 'good' && (level === 'poor' || highDelta)) {
    consider.push('Ask the workshop whether a larger intercooler core, or better air flow to it (ducting, no blocked grille), would pay off.')
  }
  if (summary.meanEffectiveness != null && summary.meanEffectiveness < VERDICT_THRESHOLDS.lowEffectiveness) {
    consider.push(`The intercooler removes only about ${(summary.meanEffectiveness * 100).toFixed(0)} % of the heat it could: check for a blocked or damaged core and for air going around it.`)
  }
  if (level !== 'good' && vehicle?.fuel === 'petrol') {
    consider.push('On a petrol engine, hot charge air also raises the risk of knock; the engine management may pull timing, costing more than the density figure shows.')
  }
  if (summary.projection.morePulls != null && summary.projection.morePulls > 0) {
    consider.push(`At this rate about ${summary.projection.morePulls} more ${pullWord(summary.projection.morePulls)} would cost ${pct(summary.projection.lossPct, 0)} of power against the coolest pull.`)
  }

  return { level, headline, summary: leftOut.length ? `${summaryText} (${leftOut.length} ${pullWord(leftOut.length)} left out; see below.)` : summaryText, meaning, consider, facts, assumptions, drive, offerKeepLeftOut: false }
}
