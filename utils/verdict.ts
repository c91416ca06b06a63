// The plain-language verdict at the top of a report: worded for the driver, with the exact
// figures a tuner wants underneath. Thresholds are our own workshop judgement (common practice,
// no source): under ~1.5 % power lost between the coolest and hottest pull a driver will not feel
// it; past ~4 % it shows on a dyno sheet and in the seat.
import type { TemperatureUnit, PowerUnit } from '~/stores/units'
import type { AnalysisResult, LogVehicle } from '#shared/types/report'
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
}

export const VERDICT_THRESHOLDS = {
  /** Max power lost vs the coolest pull below which the core is judged to hold up, %. */
  goodLossPct: 1.5,
  /** Above this the soak is judged heavy, %. */
  poorLossPct: 4,
  /** Charge air this far above outside air on average is a lot for a working intercooler, K. */
  highDeltaK: 25,
  /** Effectiveness below this is low for an air-to-air core at full load. */
  lowEffectiveness: 0.6,
} as const

export interface VerdictUnits {
  temperature: TemperatureUnit
  power: PowerUnit
}

const pct = (value: number, digits = 1) => `${value.toFixed(digits)} %`
const KW_PER: Record<PowerUnit, number> = { kW: 1, hp: 0.74569987158227, PS: 0.73549875 }
const powerText = (kw: number, unit: PowerUnit) => `${(kw / KW_PER[unit]).toFixed(kw / KW_PER[unit] < 10 ? 1 : 0)} ${unit}`
const pullWord = (n: number) => (n === 1 ? 'pull' : 'pulls')
const NUMBER_WORDS = ['no', 'one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine', 'ten', 'eleven', 'twelve']
const count = (n: number) => NUMBER_WORDS[n] ?? String(n)

export function verdictFor(analysis: AnalysisResult, vehicle: Pick<LogVehicle, 'ratedPowerKw' | 'fuel'> | null, units: VerdictUnits = { temperature: 'C', power: 'kW' }): Verdict {
  const { summary, pulls } = analysis
  const t = units.temperature
  const assumptions = `These figures assume an air-limited engine at the same boost: power is taken to follow charge-air density (hotter air is thinner). That is an upper bound — engine management often makes up part of it. ${summary.ambientSource === 'entered' ? 'The outside air temperature was entered by hand, not logged.' : ''}`.trim()
  const facts: Verdict['facts'] = [
    { label: 'Pulls analysed', value: String(summary.pullCount) },
    { label: 'Charge-air rise, first to last pull', value: formatTemperatureDifference(summary.chargeTempRiseK, t) },
    { label: 'Soak per pull', value: summary.soakIndexKPerPull == null ? '—' : `${formatTemperatureDifference(summary.soakIndexKPerPull, t, 2)} per pull${summary.soakFitR2 == null ? '' : ` (fit R² ${summary.soakFitR2.toFixed(2)})`}` },
    { label: 'Mean rise over outside air', value: formatTemperatureDifference(summary.meanDeltaOverAmbientK, t) },
    { label: 'Mean effectiveness', value: summary.meanEffectiveness == null ? '—' : `${(summary.meanEffectiveness * 100).toFixed(0)} %${summary.effectivenessSource === 'estimated' ? ' (estimated)' : ''}` },
    { label: 'Most power lost vs coolest pull', value: summary.maxPowerLossVsCoolestPct == null ? '—' : pct(summary.maxPowerLossVsCoolestPct) },
  ]
  if (summary.recoveryTimeConstantS != null) facts.push({ label: 'Core recovery time constant', value: `${summary.recoveryTimeConstantS.toFixed(0)} s` })

  if (summary.pullCount === 0) {
    return {
      level: 'unknown',
      headline: 'No full-throttle runs found in this log',
      summary: 'The log was read, but it has no stretch held at full throttle long enough to judge the intercooler.',
      meaning: 'Heat soak shows over several hard runs in a row; without them there is nothing to compare.',
      consider: [
        'Record a new log with four to six full-throttle runs on a dyno or closed course, with short gaps between them.',
        'If the runs are in this log, a tuner can mark them by hand on the chart.',
      ],
      facts,
      assumptions,
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
      headline: 'One full-throttle run: not enough to judge heat soak',
      summary: `In the one run found, the charge air sat ${formatTemperatureDifference(single?.meanDeltaOverAmbientK ?? delta, t)} above the outside air.`,
      meaning: 'Heat soak is the climb from run to run; it takes at least two runs, better four to six, to see it.',
      consider: ['Record several full-throttle runs in a row on a dyno or closed course and upload that log.'],
      facts,
      assumptions,
    }
  }

  const level: VerdictLevel = loss < VERDICT_THRESHOLDS.goodLossPct ? 'good' : loss < VERDICT_THRESHOLDS.poorLossPct ? 'fair' : 'poor'
  const n = summary.pullCount
  const climbed = rise == null
    ? ''
    : rise >= 0.5
      ? `Over ${count(n)} ${pullWord(n)} the charge air climbed ${formatTemperatureDifference(rise, t)} from the first to the last run`
      : `Over ${count(n)} ${pullWord(n)} the charge air stayed steady (${formatTemperatureDifference(rise, t)} from the first to the last run)`
  const summaryText = `${climbed}, and the hottest run made about ${lossWithPower} less power than the coolest.`

  const headline = {
    good: 'The intercooler holds up well',
    fair: 'Some heat soak: the car loses a little power run after run',
    poor: 'Heavy heat soak: the car loses noticeable power as it heats up',
    unknown: '',
  }[level]
  const meaning = {
    good: 'Repeated hard runs cost very little power; you are unlikely to feel any difference.',
    fair: 'On a track day or a long climb the car will feel a little flatter after a few runs, and recover once it cools down.',
    poor: 'After a few hard runs the car makes clearly less power; a dyno run or a lap late in a session will be slower than the first.',
    unknown: '',
  }[level]

  const consider: string[] = []
  if (level === 'good') consider.push('No change needed for heat soak. Keep this log as the reference for later comparisons.')
  if (level !== 'good') consider.push('Give the car more time between hard runs; the charge air recovers as the core cools.')
  if (level === 'poor' || (delta != null && delta > VERDICT_THRESHOLDS.highDeltaK)) {
    consider.push('Ask the workshop whether a larger intercooler core, or better air flow to it (ducting, no blocked grille), would pay off.')
  }
  if (summary.meanEffectiveness != null && summary.meanEffectiveness < VERDICT_THRESHOLDS.lowEffectiveness) {
    consider.push(`The intercooler removes only about ${(summary.meanEffectiveness * 100).toFixed(0)} % of the heat it could: check for a blocked or damaged core and for air going around it.`)
  }
  if (level !== 'good' && vehicle?.fuel === 'petrol') {
    consider.push('On a petrol engine, hot charge air also raises the risk of knock; the engine management may pull timing, costing more than the density figure shows.')
  }
  if (summary.projection.morePulls != null && summary.projection.morePulls > 0) {
    consider.push(`At this rate about ${summary.projection.morePulls} more ${pullWord(summary.projection.morePulls)} would cost ${pct(summary.projection.lossPct, 0)} of power against the coolest run.`)
  }

  return { level, headline, summary: summaryText, meaning, consider, facts, assumptions }
}
