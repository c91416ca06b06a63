// Dyno runs: each measured power restated at reference air by the four standards the workshop can
// quote (correction.ts, formulas from memory as stated there), and before/after corrected power
// compared with the same Welch statistics as the logs (comparison.ts).
import { formatFixed } from '../../shared/utils/format'
import { compareSamples } from './comparison'
import { KELVIN_OFFSET } from './constants'
import { din70020, iso1585CompressionIgnition, iso1585SparkIgnition, saeJ1349_1990, saeJ1349_2004, type CorrectionResult } from './correction'
import { DYNO_SPREAD_NOTE } from './beforeAfter'

export const DYNO_STANDARDS = ['sae-j1349-2004', 'sae-j1349-1990', 'iso-1585', 'din-70020'] as const
export type DynoStandard = typeof DYNO_STANDARDS[number]

/**
 * Full-load specific fuel consumption assumed for a turbo-diesel when the dyno run carries no
 * fuel flow, g/kWh. Common practice, no source: 200–230 g/kWh at full load.
 */
export const ASSUMED_DIESEL_BSFC_G_KWH = 215
/** Boost pressure ratio assumed for ISO 1585's engine factor when none is recorded. Common practice, no source. */
export const ASSUMED_PRESSURE_RATIO = 2

export interface DynoRunInput {
  powerKw: number
  rpm?: number | null
  ambientTempC: number
  baroKpa: number
  humidityPct?: number | null
}

export interface DynoEngine {
  fuel: 'diesel' | 'petrol'
  displacementL: number
}

export interface DynoCorrection {
  standard: DynoStandard
  name: string
  factor: number | null
  correctedPowerKw: number | null
  valid: boolean
  notes: string[]
}

function fromResult(standard: DynoStandard, result: CorrectionResult, extraNotes: string[] = []): DynoCorrection {
  return {
    standard,
    name: result.standard,
    factor: Number.isFinite(result.factor) ? result.factor : null,
    correctedPowerKw: result.correctedKw !== undefined && Number.isFinite(result.correctedKw) ? result.correctedKw : null,
    valid: result.valid,
    notes: [...extraNotes, ...result.notes, result.provenance],
  }
}

/** The four corrections of one dyno run; ISO 1585 as spark or compression ignition by the car's fuel. */
export function correctDynoRun(run: DynoRunInput, engine: DynoEngine): DynoCorrection[] {
  // The standards mean the air the engine draws in: the dyno cell's ambient air for a turbo engine.
  const atmosphere = {
    baroPa: run.baroKpa * 1000,
    intakeTempK: run.ambientTempC + KELVIN_OFFSET,
    relativeHumidity: run.humidityPct == null ? undefined : run.humidityPct / 100,
    observedKw: run.powerKw,
  }
  let iso: DynoCorrection
  if (engine.fuel === 'petrol') {
    iso = fromResult('iso-1585', iso1585SparkIgnition(atmosphere))
  }
  else if (!run.rpm) {
    iso = {
      standard: 'iso-1585',
      name: 'ISO 1585 / UNECE R85 compression ignition',
      factor: null,
      correctedPowerKw: null,
      valid: false,
      notes: ['The compression-ignition factor needs the engine speed of the power figure. Record the rpm of the dyno run to get it.'],
    }
  }
  else {
    const fuelFlowGS = run.powerKw * ASSUMED_DIESEL_BSFC_G_KWH / 3600
    iso = fromResult('iso-1585', iso1585CompressionIgnition({ ...atmosphere, aspiration: 'turbocharged', fuelFlowGS, displacementL: engine.displacementL, rpm: run.rpm, pressureRatio: ASSUMED_PRESSURE_RATIO }), [
      `Fuel flow not measured: estimated from the power at ${ASSUMED_DIESEL_BSFC_G_KWH} g/kWh, with a boost pressure ratio of ${ASSUMED_PRESSURE_RATIO} (common practice, no source).`,
    ])
  }
  return [
    fromResult('sae-j1349-2004', saeJ1349_2004(atmosphere)),
    fromResult('sae-j1349-1990', saeJ1349_1990(atmosphere)),
    iso,
    fromResult('din-70020', din70020(atmosphere)),
  ]
}

export interface DynoSideInput {
  side: 'before' | 'after'
  correctedPowerKw: number
}

export interface DynoComparison {
  standard: DynoStandard
  before: { n: number, meanKw: number, interval: [number, number] | null }
  after: { n: number, meanKw: number, interval: [number, number] | null }
  changeKw: number
  changePct: number
  interval: [number, number] | null
  verdict: string
  verdictTone: 'better' | 'worse' | 'noise' | 'too-few'
  dynoSpreadNote: string
}

const pair = (low: number, high: number): [number, number] | null => (Number.isFinite(low) && Number.isFinite(high) ? [low, high] : null)

/** Before vs after corrected power; null unless both sides have at least one run. */
export function compareDynoRuns(runs: readonly DynoSideInput[], standard: DynoStandard): DynoComparison | null {
  const before = runs.filter(r => r.side === 'before').map(r => r.correctedPowerKw).filter(Number.isFinite)
  const after = runs.filter(r => r.side === 'after').map(r => r.correctedPowerKw).filter(Number.isFinite)
  if (!before.length || !after.length) return null
  const c = compareSamples(before, after)
  const beforeMean = c.before.mean
  const changeKw = c.after.mean - beforeMean
  const changePct = 100 * changeKw / beforeMean
  const interval = pair(c.difference.low, c.difference.high)
  let verdictTone: DynoComparison['verdictTone']
  let verdict: string
  const change = `${changeKw >= 0 ? '+' : '−'}${Math.abs(changeKw).toFixed(1)} kW (${changePct >= 0 ? '+' : '−'}${Math.abs(changePct).toFixed(1)} %)`
  if (!interval) {
    verdictTone = 'too-few'
    verdict = `Corrected power changed by ${change}. With ${before.length === 1 && after.length === 1 ? 'one dyno run a side' : 'fewer than two dyno runs on a side'} there is no interval: ${Math.abs(changePct) <= 3 ? 'a change this small is within the usual run-to-run spread.' : 'two or three dyno runs a side would show whether it is more than run-to-run spread.'}`
  }
  else if (c.differenceExcludesZero && Math.abs(changePct) > 3) {
    verdictTone = changeKw > 0 ? 'better' : 'worse'
    verdict = `Corrected power ${changeKw > 0 ? 'rose' : 'fell'} by ${change}; 95 % interval ${formatFixed(interval[0])} to ${formatFixed(interval[1])} kW.`
  }
  else {
    verdictTone = 'noise'
    verdict = `Corrected power changed by ${change}, within the noise: the 95 % interval is ${formatFixed(interval[0])} to ${formatFixed(interval[1])} kW${Math.abs(changePct) <= 3 ? ', and 2–3 % is within a dyno\'s run-to-run spread' : ''}.`
  }
  return {
    standard,
    before: { n: before.length, meanKw: beforeMean, interval: pair(c.before.low, c.before.high) },
    after: { n: after.length, meanKw: c.after.mean, interval: pair(c.after.low, c.after.high) },
    changeKw,
    changePct,
    interval,
    verdict,
    verdictTone,
    dynoSpreadNote: DYNO_SPREAD_NOTE,
  }
}
