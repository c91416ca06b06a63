// Engine power correction to reference atmospheric conditions for dyno figures.
//
// PROVENANCE — read before calling anything here "per standard". The SAE, ISO, UNECE, EEC and
// DIN texts were not available to the authors (paywalled). The formulas below are FROM MEMORY
// (reference sheet §3, §12) unless a line says otherwise:
//  - CONFIRMED (from an engine maker's workshop manual reproducing the ISO/JIS diesel method):
//    αc = fa^fm; fm = 0.036·qc − 1.14; qc = q/r; q = z·F/(V·n) with z = 120 000 for four-stroke;
//    fm formula valid 37.2 ≤ qc ≤ 65; correction applicable for 0.9 ≤ αc ≤ 1.1.
//  - MEMORY: the SAE 1.18/0.18 and 1.176/0.176 terms, the ISO SI exponents 1.2/0.6 and its
//    0.93…1.07 band, the CI fa exponents (0.7/1.5 turbo, 1/0.7 NA), the EEC/ECE fm clamps
//    (qc < 40 → 0.3), the ISO clamp below 37.2 (→ 0.2), z = 60 000 for two-stroke, DIN 70020 in full.
// Every result carries `fromMemory: true` and a `provenance` string so the UI can show this.
//
// Temperature: the standards mean the engine's intake air (for a turbo engine, ambient air at the
// compressor inlet), not the post-intercooler charge temperature.
import { KELVIN_OFFSET } from './constants'
import { saturationVapourPressurePa } from './density'
import { INHG_PA, toSI } from '../../shared/quantities/units'

export interface AtmosphereInput {
  /** barometric (total) pressure, Pa */
  baroPa: number
  /** intake-air temperature, K */
  intakeTempK: number
  /** water vapour partial pressure, Pa; takes precedence over relativeHumidity */
  vapourPressurePa?: number
  /** 0…1; converted with Hyland–Wexler (ASHRAE 2017). Neither given → dry air assumed */
  relativeHumidity?: number
  /** observed power to correct, kW */
  observedKw?: number
}

export interface CorrectionResult {
  standard: string
  factor: number
  correctedKw?: number
  /** false when the factor or inputs fall outside the standard's stated band */
  valid: boolean
  /** the band checked, if the standard has one that we know of */
  band?: { min: number, max: number, of: 'factor' }
  notes: string[]
  fromMemory: true
  provenance: string
  /** pressure actually used, kPa (dry for SAE/ISO, total for DIN) */
  pressureKpa: number
}

/** Vapour pressure from the inputs, Pa (0 when no humidity is given: dry air assumed). */
export function vapourPressureFromInput(input: AtmosphereInput): number {
  if (input.vapourPressurePa !== undefined) return input.vapourPressurePa
  if (input.relativeHumidity !== undefined) {
    return input.relativeHumidity * saturationVapourPressurePa(input.intakeTempK - KELVIN_OFFSET)
  }
  return 0
}

/** Dry-air pressure p_d = p_baro − p_v, kPa (used by SAE, ISO, ECE, EEC, JIS). */
export function dryPressureKpa(input: AtmosphereInput): number {
  return (input.baroPa - vapourPressureFromInput(input)) / 1000
}

function humidityNotes(input: AtmosphereInput): string[] {
  return input.vapourPressurePa === undefined && input.relativeHumidity === undefined
    ? ['No humidity given: dry air assumed (p_d = barometric pressure).']
    : []
}

function finish(
  input: AtmosphereInput,
  base: Omit<CorrectionResult, 'correctedKw' | 'fromMemory' | 'valid'> & { valid?: boolean },
): CorrectionResult {
  const inBand = base.band ? base.factor >= base.band.min && base.factor <= base.band.max : true
  const valid = (base.valid ?? true) && inBand && Number.isFinite(base.factor)
  const notes = [...base.notes]
  if (base.band && !inBand) {
    notes.push(`Factor ${base.factor.toFixed(4)} is outside ${base.band.min}…${base.band.max}: report the corrected value together with the test conditions.`)
  }
  return {
    ...base,
    valid,
    notes,
    fromMemory: true,
    ...(input.observedKw !== undefined ? { correctedKw: input.observedKw * base.factor } : {}),
  }
}

/**
 * SAE J1349 (June 1990), spark ignition: CF = 1.18·(99/p_d)·(T/298)^0.5 − 0.18. FROM MEMORY.
 * The 1.18/−0.18 terms build in an assumed mechanical efficiency of about 85 %.
 */
export function saeJ1349_1990(input: AtmosphereInput): CorrectionResult {
  const pd = dryPressureKpa(input)
  return finish(input, {
    standard: 'SAE J1349 (1990)',
    factor: 1.18 * (99 / pd) * Math.sqrt(input.intakeTempK / 298) - 0.18,
    pressureKpa: pd,
    notes: [...humidityNotes(input), 'Validity range of SAE J1349 not confirmed: no band applied.'],
    provenance: 'Formula from memory (SAE text not available); reference 99 kPa dry, 298 K.',
  })
}

/**
 * SAE J1349 (August 2004 and later), spark ignition: CF = 1.176·(99/p_d)·(T/298)^0.5 − 0.176
 * (1/0.85 = 1.176). FROM MEMORY.
 */
export function saeJ1349_2004(input: AtmosphereInput): CorrectionResult {
  const pd = dryPressureKpa(input)
  return finish(input, {
    standard: 'SAE J1349 (2004)',
    factor: 1.176 * (99 / pd) * Math.sqrt(input.intakeTempK / 298) - 0.176,
    pressureKpa: pd,
    notes: [...humidityNotes(input), 'Validity range of SAE J1349 not confirmed: no band applied.'],
    provenance: 'Formula from memory (SAE text not available); reference 99 kPa dry, 298 K.',
  })
}

/** ISO 1585 test-condition window recalled as 288–308 K (from memory, not confirmed). */
const ISO_TEST_WINDOW_K = { min: 288, max: 308 }

/**
 * ISO 1585:1992 / UNECE R85 / 80/1269/EEC, spark ignition (naturally aspirated and
 * pressure-charged): αa = (99/p_d)^1.2·(T/298)^0.6, valid only for 0.93 ≤ αa ≤ 1.07. FROM MEMORY.
 */
export function iso1585SparkIgnition(input: AtmosphereInput): CorrectionResult {
  const pd = dryPressureKpa(input)
  const notes = [...humidityNotes(input)]
  if (input.intakeTempK < ISO_TEST_WINDOW_K.min || input.intakeTempK > ISO_TEST_WINDOW_K.max) {
    notes.push(`Intake temperature outside the ${ISO_TEST_WINDOW_K.min}–${ISO_TEST_WINDOW_K.max} K test window (window from memory).`)
  }
  return finish(input, {
    standard: 'ISO 1585 / UNECE R85 spark ignition',
    factor: Math.pow(99 / pd, 1.2) * Math.pow(input.intakeTempK / 298, 0.6),
    pressureKpa: pd,
    band: { min: 0.93, max: 1.07, of: 'factor' },
    notes,
    provenance: 'Formula and 0.93–1.07 band from memory (ISO/UNECE text not available); reference 99 kPa dry, 298 K.',
  })
}

export type CiAspiration = 'natural' | 'turbocharged'
/** fm clamp rules: ISO 1585:1992/JIS (formula 37.2…65) or ECE R85/80/1269/EEC (40…65). */
export type CiClampRule = 'iso' | 'ece'

export interface CompressionIgnitionInput extends AtmosphereInput {
  /** 'natural' also covers mechanically supercharged engines */
  aspiration: CiAspiration
  /** fuel flow F, g/s */
  fuelFlowGS: number
  displacementL: number
  rpm: number
  /** r = boost pressure (compressor or charge-air-cooler outlet) / atmospheric; 1 when naturally aspirated */
  pressureRatio?: number
  strokes?: 2 | 4
  clampRule?: CiClampRule
}

export interface EngineFactor {
  /** fuel per litre per cycle, mg/(L·cycle) */
  q: number
  /** q corrected by the pressure ratio, q/r */
  qc: number
  fm: number
  /** true when qc is inside the range where the fm formula applies */
  inFormulaRange: boolean
}

/**
 * Engine factor fm = 0.036·qc − 1.14, qc = q/r, q = z·F/(V·n) (CONFIRMED, engine maker's manual
 * reproducing ISO 1585/JIS). z = 120 000 four-stroke (confirmed), 60 000 two-stroke (memory).
 * Outside the formula range: ISO 1585:1992 qc < 37.2 → 0.2 (memory), ECE/EEC qc < 40 → 0.3
 * (memory), both qc > 65 → 1.2 (memory).
 */
export function ciEngineFactor({ fuelFlowGS, displacementL, rpm, pressureRatio = 1, strokes = 4, clampRule = 'iso' }: {
  fuelFlowGS: number
  displacementL: number
  rpm: number
  pressureRatio?: number
  strokes?: 2 | 4
  clampRule?: CiClampRule
}): EngineFactor {
  const z = strokes === 4 ? 120000 : 60000
  const q = z * fuelFlowGS / (displacementL * rpm)
  const qc = q / pressureRatio
  const low = clampRule === 'iso' ? { qc: 37.2, fm: 0.2 } : { qc: 40, fm: 0.3 }
  let fm = 0.036 * qc - 1.14
  let inFormulaRange = true
  if (qc < low.qc) {
    fm = low.fm
    inFormulaRange = false
  }
  else if (qc > 65) {
    fm = 1.2
    inFormulaRange = false
  }
  return { q, qc, fm, inFormulaRange }
}

/**
 * Atmospheric factor fa for compression ignition (FROM MEMORY): naturally aspirated or
 * mechanically supercharged fa = (99/p_d)·(T/298)^0.7; turbocharged with or without charge-air
 * cooling fa = (99/p_d)^0.7·(T/298)^1.5 (the EEC/ECE wording; ISO has a separate air-to-liquid
 * cooler case whose exponents are not known to us).
 */
export function ciAtmosphericFactor(pdKpa: number, intakeTempK: number, aspiration: CiAspiration): number {
  return aspiration === 'natural'
    ? (99 / pdKpa) * Math.pow(intakeTempK / 298, 0.7)
    : Math.pow(99 / pdKpa, 0.7) * Math.pow(intakeTempK / 298, 1.5)
}

/**
 * ISO 1585 / UNECE R85 compression ignition: αc = fa^fm, applicable for 0.9 ≤ αc ≤ 1.1
 * (structure and band CONFIRMED; exponents and clamps FROM MEMORY, see above).
 */
export function iso1585CompressionIgnition(input: CompressionIgnitionInput): CorrectionResult & { fa: number, engineFactor: EngineFactor } {
  const pd = dryPressureKpa(input)
  const fa = ciAtmosphericFactor(pd, input.intakeTempK, input.aspiration)
  const engineFactor = ciEngineFactor(input)
  const notes = [...humidityNotes(input)]
  if (!engineFactor.inFormulaRange) {
    notes.push(`qc = ${engineFactor.qc.toFixed(2)} mg/(L·cycle) is outside the fm formula range; fm held at ${engineFactor.fm} (clamp from memory).`)
  }
  if (input.aspiration === 'turbocharged') {
    notes.push('Turbocharged fa as worded for engines with or without air-to-air charge cooling; check the ISO text for air-to-liquid coolers.')
  }
  const result = finish(input, {
    standard: 'ISO 1585 / UNECE R85 compression ignition',
    factor: Math.pow(fa, engineFactor.fm),
    pressureKpa: pd,
    band: { min: 0.9, max: 1.1, of: 'factor' },
    notes,
    provenance: 'αc = fa^fm, fm formula, q/qc/z/r definitions, 37.2–65 range and 0.9–1.1 band confirmed (engine maker\'s manual); fa exponents, fm clamps and two-stroke z from memory.',
  })
  return { ...result, fa, engineFactor }
}

/**
 * DIN 70020 (withdrawn): CF = (1013/p)·(T/293)^0.5 with p the TOTAL barometric pressure in
 * mbar; humidity ignored. FROM MEMORY (constants 1013 and 293 also seen in a secondary
 * quotation). No validity band known.
 */
export function din70020(input: AtmosphereInput): CorrectionResult {
  const pMbar = input.baroPa / 100
  return finish(input, {
    standard: 'DIN 70020',
    factor: (1013 / pMbar) * Math.sqrt(input.intakeTempK / 293),
    pressureKpa: input.baroPa / 1000,
    notes: ['Uses total barometric pressure; humidity is ignored by this standard.', 'Standard withdrawn; no validity band known.'],
    provenance: 'Formula from memory (DIN text not available); reference 1013 mbar total, 293 K.',
  })
}

/**
 * SAE J607 (small engines, obsolete): CF = (29.92 inHg/p_d)·(T/519.67 °R)^0.5. FROM MEMORY; kept
 * only because old dyno sheets still quote it.
 */
export function saeJ607(input: AtmosphereInput): CorrectionResult {
  const pd = dryPressureKpa(input)
  return finish(input, {
    standard: 'SAE J607',
    factor: (29.92 * INHG_PA / 1000 / pd) * Math.sqrt(input.intakeTempK / toSI(60, 'degF')),
    pressureKpa: pd,
    notes: [...humidityNotes(input), 'Obsolete standard; no validity band known.'],
    provenance: 'Formula from memory; reference 29.92 inHg dry, 60 °F.',
  })
}

/** Every spark-ignition correction for one atmosphere, for side-by-side display. */
export function sparkIgnitionCorrections(input: AtmosphereInput): CorrectionResult[] {
  return [saeJ1349_1990(input), saeJ1349_2004(input), iso1585SparkIgnition(input), din70020(input)]
}
