// Front-mount sizing from the car's own log: calibrate the fitted core's UA from what the log
// measured, scale it to each candidate core, and predict the charge temperature each would give at
// the design conditions the fabricator sets. Framework-free; every relation names its source.
//
// Chain (reference sheet sections in brackets):
// 1. charge mass flow in the log: MAF mean over the pulls, else speed-density (§8.2, Heywood 1988
//    §2.10, section from memory) with a stated volumetric efficiency;
// 2. cooling air through the core: a share of road speed (common practice, no source) × face area
//    × ideal-gas density at ambient (§2);
// 3. UA of the fitted core from the log's effectiveness by inverting the crossflow ε-NTU relation
//    (§6, Incropera et al. 6th ed. §11.4; Kays & London; `calibrateUa`);
// 4. UA of a candidate: the calibrated UA split into a charge-side and a cooling-air-side
//    conductance (equal halves of the resistance: common practice, no source), each scaled with
//    core volume (face area × depth, same fin and tube pitch) and with its stream's speed —
//    charge side h ∝ Re^0.8 (Dittus–Boelter, Incropera et al. 6th ed. §8.5, from memory), the
//    charge crossing the width so its flow area ∝ height × depth; air side h ∝ Re^0.5 (laminar
//    boundary layer on the fins, Incropera §7.2, from memory). With equal speeds this reduces to
//    UA ∝ face area × depth;
// 5. at design: compressor outlet temperature from the pressure ratio (§4), each core's outlet
//    temperature from ε-NTU (`predictCore`), density ratio at equal manifold pressure from the ideal
//    gas law (§7: ρ ∝ p/T), power by the density law (an upper bound, §7);
// 6. pressure drop ∝ ṁ²·depth/face area (common practice, no source), anchored at a reference core;
// 7. the installation: an ideal ε-NTU core approaches 1 as it grows, a core on the road does not
//    (see ROAD_EFFECTIVENESS_CEILING). The log's reading is divided by the ceiling before step 3 and
//    every prediction multiplied by it, so the fitted core is reproduced exactly.
//
// Why step 7 (issue 9): calibrated on the demo car's factory-core log, steps 1–6 alone predicted
// 0.97 for the 600 front-mount that the demo's own after-log measured at 0.86. The share of road
// speed in step 2 is not the cause (0.10–0.40 of road speed moves that 0.97 by less than 0.01: the
// cooling air is ten times the charge air, so its amount hardly matters); the face area × depth
// scaling of step 4 gives the front-mount three times the factory core's UA, and the ideal
// crossflow relation turns NTU 4 at Cr 0.09 into 0.97. What the ideal core leaves out — shaded
// face, warmed cooling air, heat picked up after the core — is what keeps real cores lower.
import { compressorEfficiencyFromTemps, compressorOutletTempK, DEFAULT_COMPRESSOR_EFFICIENCY } from './compressor'
import { KELVIN_OFFSET, R_DRY_AIR } from './constants'
import { toSI } from '../../shared/quantities/units'
import { dryAirDensity } from './density'
import { calibrateUa, massFlowFromPower, massFlowSpeedDensity, predictCore } from './entu'
import { LogImportError } from './import/errors'

export class SizingError extends Error {
  constructor(public readonly code: SizingErrorCode, message: string) {
    super(message)
    this.name = 'SizingError'
  }
}

export type SizingErrorCode = 'NO_PULLS' | 'NO_EFFECTIVENESS' | 'NO_MASS_FLOW' | 'NO_ROAD_SPEED' | 'BAD_DESIGN' | 'NOT_CALIBRATABLE' | 'NO_CANDIDATES'

export const isSizingError = (error: unknown): error is SizingError => error instanceof SizingError

/**
 * Volumetric efficiency referenced to manifold conditions for speed-density. Common practice, no
 * source: a boosted engine referenced this way runs about 0.85–1.0 (reference sheet §8.2).
 */
export const DEFAULT_VOLUMETRIC_EFFICIENCY = 0.9

/**
 * Air speed through the core face as a share of road speed. Common practice, no source: the grille,
 * bumper and the radiator behind let only part of the ram air through (wind-tunnel work on how a
 * bumper and grille spread the air over a radiator exists, e.g. SAE 760188, but no share is taken
 * from it here). 0.25 gives the 4 m/s of the reference example (§6.3) at about 58 km/h. The
 * predictions hardly depend on it: the cooling air is several times the charge air, so Cr stays
 * small (0.10 to 0.40 moves the demo front-mount's prediction by under 0.02, a unit test checks).
 */
export const CORE_AIR_SPEED_RATIO = 0.25

/**
 * The most a core reads on the road, as a share of what the ideal ε-NTU core would give. Common
 * practice, no source: logs of large front-mounts on the road seldom read above about 0.9 (from
 * memory). The effectiveness a log measures is taken at the manifold sensor, not at the core: part
 * of the face sits behind the bumper beam, the number plate and brackets and gets little air; the
 * air that arrives is warmer than the ambient reading (road, radiator, the car in front); and the
 * charge picks heat back up in the pipes and manifold after the core. None of that shrinks as the
 * core grows, so it is one factor on every core: read = ceiling × ideal.
 */
export const ROAD_EFFECTIVENESS_CEILING = 0.9

/**
 * A log that reads within this of the ceiling (or above it) raises the ceiling to its reading plus
 * this, for that sizing: the car has shown its installation does better (common practice, no source).
 */
export const CEILING_MARGIN = 0.03

/** Road speed assumed when neither the log nor the design gives one (common practice, no source). */
export const DEFAULT_ROAD_SPEED_KMH = 80

/**
 * Pressure-drop anchor for Δp = K·ṁ²·depth/face area: a 600 × 300 × 76 mm bar-and-plate front-mount
 * at 0.155 kg/s loses about 8 kPa (common practice, no source: inside the 5–15 kPa the trade quotes
 * for a good front-mount, reference sheet §9).
 */
export const PRESSURE_DROP_ANCHOR = { faceAreaM2: 0.6 * 0.3, depthM: 0.076, massFlowKgS: 0.155, dropKpa: 8 }
const PRESSURE_DROP_K = PRESSURE_DROP_ANCHOR.dropKpa * PRESSURE_DROP_ANCHOR.faceAreaM2
  / (PRESSURE_DROP_ANCHOR.massFlowKgS ** 2 * PRESSURE_DROP_ANCHOR.depthM)

/** Fuel use at full load for a design power (reference sheet §8.1; common practice, no source). */
const FULL_LOAD_FUEL = {
  diesel: { bsfcKgPerKwh: 0.23, afrStoich: 14.5, lambda: 1.3 },
  petrol: { bsfcKgPerKwh: 0.30, afrStoich: 14.7, lambda: 0.85 },
} as const

/** Gains smaller than this are inside normal dyno run-to-run spread (common practice, §7). */
export const MARGINAL_GAIN_PCT = 2

export interface SizingCore {
  id: number
  name: string
  faceWidthMm: number
  faceHeightMm: number
  depthMm: number
}

export interface SizingPull {
  effectiveness: number | null
  effectivenessSource: 'measured' | 'estimated' | null
  meanManifoldKpa: number | null
  meanRpm: number | null
  meanChargeTempC: number
  meanSpeedKmh: number | null
  ambientTempC: number
  preCoolerTempC: number | null
}

export interface SizingDesign {
  ambientC: number
  boostKpaAbs?: number
  targetPowerKw?: number
  roadSpeedKmh?: number
}

export interface SizingInput {
  engine: { displacementL: number, fuel: 'diesel' | 'petrol' }
  log: {
    pulls: SizingPull[]
    baroKpa: number
    /** Mean MAF reading over the pulls, kg/s, when the log has the channel. */
    massAirFlowKgS?: number | null
  }
  fittedCore: SizingCore
  candidates: SizingCore[]
  design: SizingDesign
  options?: {
    volumetricEfficiency?: number
    coreAirSpeedRatio?: number
    /** Fixes the cooling-air density instead of computing it from ambient (for hand-worked checks). */
    coolingAirDensityKgM3?: number
    /** Replaces ROAD_EFFECTIVENESS_CEILING (1 = the ideal core, for hand-worked checks). */
    effectivenessCeiling?: number
  }
}

export interface SizingCalibration {
  fittedCoreId: number
  uaWPerK: number
  /** Hot-side (trade) effectiveness the UA was calibrated from, as the log measured it. */
  effectiveness: number
  effectivenessSource: 'measured' | 'estimated'
  /** The installation ceiling used (ROAD_EFFECTIVENESS_CEILING, or raised by the log's reading). */
  effectivenessCeiling: number
  /** The log's effectiveness ÷ the ceiling: the ideal core's, which the UA reproduces. */
  idealEffectiveness: number
  chargeMassFlowKgS: number
  massFlowSource: 'maf' | 'speed-density'
  volumetricEfficiency: number | null
  roadSpeedKmh: number
  coolingAirSpeedMS: number
  ntu: number
  cr: number
  pullCount: number
  logAmbientC: number
}

export interface SizingCandidate {
  coreId: number
  name: string
  uaWPerK: number
  /** Hot-side (trade) effectiveness, comparable with the log's. */
  predictedEffectiveness: number
  chargeTempC: number
  densityGainPct: number
  powerRecoveredPct: number
  powerRecoveredKw: number | null
  pressureDropKpa: number
  pressureDropChangeKpa: number
  rank: number
  reason: string
}

export interface SizingResult {
  calibration: SizingCalibration
  design: {
    ambientC: number
    boostKpaAbs: number
    roadSpeedKmh: number
    targetPowerKw: number | null
    chargeMassFlowKgS: number
    massFlowSource: 'log' | 'power'
    compressorEfficiency: number
    compressorEfficiencySource: 'log' | 'default'
    compressorOutletC: number
    fittedChargeTempC: number
    fittedEffectiveness: number
    fittedPressureDropKpa: number
  }
  candidates: SizingCandidate[]
  assumptions: string[]
}

const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length
const round = (value: number, digits: number) => Math.round(value * 10 ** digits) / 10 ** digits
const toK = (c: number) => c + KELVIN_OFFSET
const faceArea = (core: SizingCore) => core.faceWidthMm * core.faceHeightMm / 1e6
const depth = (core: SizingCore) => core.depthMm / 1000

function checkDesign(design: SizingDesign, baroKpa: number) {
  const bad = (message: string) => {
    throw new SizingError('BAD_DESIGN', message)
  }
  if (!Number.isFinite(design.ambientC) || design.ambientC < -30 || design.ambientC > 55) bad('The design ambient temperature must be between −30 and 55 °C.')
  if (design.boostKpaAbs !== undefined) {
    if (!Number.isFinite(design.boostKpaAbs) || design.boostKpaAbs > 400) bad('The design boost is an absolute manifold pressure up to 400 kPa.')
    if (design.boostKpaAbs <= baroKpa + 5) bad(`The design boost (${design.boostKpaAbs} kPa absolute) must be above the barometric pressure of the log (${baroKpa.toFixed(1)} kPa): with no boost there is nothing for an intercooler to cool.`)
  }
  if (design.targetPowerKw !== undefined && (!Number.isFinite(design.targetPowerKw) || design.targetPowerKw <= 0 || design.targetPowerKw > 1500)) bad('The target power must be between 1 and 1500 kW.')
  if (design.roadSpeedKmh !== undefined && (!Number.isFinite(design.roadSpeedKmh) || design.roadSpeedKmh < 20 || design.roadSpeedKmh > 300)) {
    bad('The design road speed must be between 20 and 300 km/h: below that the core depends on a fan, which this model does not know.')
  }
}

/** Charge mass flow of the log: MAF when logged, else speed-density at the pulls' means. */
function logMassFlow(input: SizingInput, pulls: SizingPull[], volumetricEfficiency: number) {
  const maf = input.log.massAirFlowKgS
  if (maf != null && Number.isFinite(maf) && maf > 0) return { massFlowKgS: maf, source: 'maf' as const, manifoldKpa: meanOf(pulls, p => p.meanManifoldKpa) }
  const rpm = meanOf(pulls, p => p.meanRpm)
  const manifoldKpa = meanOf(pulls, p => p.meanManifoldKpa)
  if (rpm === null || manifoldKpa === null) {
    throw new SizingError('NO_MASS_FLOW', 'The log has neither an air mass flow column nor engine speed and boost, so the flow of charge air cannot be worked out. Log engine speed and boost (or air mass flow) and try again.')
  }
  const chargeK = toK(mean(pulls.map(p => p.meanChargeTempC)))
  // ṁ = η_v·ρ_man·V_d·N/120 (Heywood 1988 §2.10, section from memory; reference sheet §8.2).
  const massFlowKgS = massFlowSpeedDensity({ displacementL: input.engine.displacementL, rpm, mapPa: manifoldKpa * 1000, iatK: chargeK, volumetricEfficiency })
  return { massFlowKgS, source: 'speed-density' as const, manifoldKpa }
}

function meanOf(pulls: SizingPull[], pick: (p: SizingPull) => number | null): number | null {
  const values = pulls.map(pick).filter((v): v is number => v !== null && Number.isFinite(v))
  return values.length ? mean(values) : null
}

/** Compressor efficiency backed out of the log's measured pre-cooler temperatures, when it has them. */
function logCompressorEfficiency(pulls: SizingPull[], baroKpa: number): number | null {
  const values = pulls.filter(p => p.effectivenessSource === 'measured' && p.preCoolerTempC !== null && p.meanManifoldKpa !== null)
    .map(p => compressorEfficiencyFromTemps(toK(p.ambientTempC), toK(p.preCoolerTempC!), p.meanManifoldKpa! / baroKpa))
    .filter(v => Number.isFinite(v))
  if (!values.length) return null
  const eta = mean(values)
  // Outside this band the sensor is probably not where the log says (common practice, no source).
  return eta >= 0.5 && eta <= 0.85 ? eta : null
}

/** Exponents of h on Reynolds number (sources in the header) and the share of resistance on the charge side. */
export const CHARGE_SIDE_RE_EXPONENT = 0.8
export const AIR_SIDE_RE_EXPONENT = 0.5
export const CHARGE_SIDE_RESISTANCE_SHARE = 0.5

interface ScaleReference {
  ua: number
  core: SizingCore
  chargeMassFlowKgS: number
  airSpeedMS: number
}

/**
 * UA of a core at a given charge flow and air speed, from the calibrated one: 1/UA = 1/hA_charge +
 * 1/hA_air, each side ∝ volume × (its stream's speed)^n; the charge speed ∝ ṁ/(height × depth).
 */
export function scaledUa(ref: ScaleReference, core: SizingCore, chargeMassFlowKgS: number, airSpeedMS: number): number {
  const volumeRatio = (faceArea(core) * depth(core)) / (faceArea(ref.core) * depth(ref.core))
  const chargeFlowAreaRatio = (core.faceHeightMm * core.depthMm) / (ref.core.faceHeightMm * ref.core.depthMm)
  const chargeSpeedRatio = (chargeMassFlowKgS / ref.chargeMassFlowKgS) / chargeFlowAreaRatio
  const hAChargeRef = ref.ua / CHARGE_SIDE_RESISTANCE_SHARE
  const hAAirRef = ref.ua / (1 - CHARGE_SIDE_RESISTANCE_SHARE)
  const hACharge = hAChargeRef * volumeRatio * chargeSpeedRatio ** CHARGE_SIDE_RE_EXPONENT
  const hAAir = hAAirRef * volumeRatio * (airSpeedMS / ref.airSpeedMS) ** AIR_SIDE_RE_EXPONENT
  return 1 / (1 / hACharge + 1 / hAAir)
}

function pressureDropKpa(massFlowKgS: number, core: SizingCore) {
  return PRESSURE_DROP_K * massFlowKgS ** 2 * depth(core) / faceArea(core)
}

export function sizeCores(input: SizingInput): SizingResult {
  const volumetricEfficiency = input.options?.volumetricEfficiency ?? DEFAULT_VOLUMETRIC_EFFICIENCY
  const speedRatio = input.options?.coreAirSpeedRatio ?? CORE_AIR_SPEED_RATIO
  const baroKpa = input.log.baroKpa
  checkDesign(input.design, baroKpa)
  if (!input.candidates.length) throw new SizingError('NO_CANDIDATES', 'Pick at least one core from the catalogue to compare.')
  if (!input.log.pulls.length) throw new SizingError('NO_PULLS', 'The log has no pulls, so there is nothing to calibrate the fitted core from. Pick a log with at least one full-load pull.')

  const pulls = input.log.pulls.filter(p => p.effectiveness !== null && Number.isFinite(p.effectiveness))
  if (!pulls.length) {
    throw new SizingError('NO_EFFECTIVENESS', 'No pull of this log has an intercooler effectiveness (it needs boost, or a pre-cooler temperature). Pick another log.')
  }
  const effectiveness = mean(pulls.map(p => p.effectiveness!))
  const effectivenessSource = pulls.some(p => p.effectivenessSource === 'measured') ? 'measured' as const : 'estimated' as const
  if (!(effectiveness > 0.05 && effectiveness < 0.99)) {
    throw new SizingError('NOT_CALIBRATABLE', `The log's mean effectiveness is ${effectiveness.toFixed(2)}; a working core lies between 0.05 and 0.99. Check the temperature sensors' placement, or pick another log.`)
  }

  const flow = logMassFlow(input, pulls, volumetricEfficiency)
  const logAmbientC = mean(pulls.map(p => p.ambientTempC))
  const logRoadKmh = meanOf(pulls, p => p.meanSpeedKmh)
  const calibrationRoadKmh = logRoadKmh ?? input.design.roadSpeedKmh ?? DEFAULT_ROAD_SPEED_KMH
  if (!(calibrationRoadKmh >= 20)) {
    throw new SizingError('NO_ROAD_SPEED', `The pulls of this log average ${calibrationRoadKmh.toFixed(0)} km/h; below 20 km/h the core is cooled by the fan, not the road, and the model cannot calibrate it. Pick a log made on the road.`)
  }
  const calibrationAirMS = toSI(calibrationRoadKmh, 'km/h') * speedRatio
  // Step 7: the log read the installed core; the ideal core behind it did better by the ceiling.
  const baseCeiling = input.options?.effectivenessCeiling ?? ROAD_EFFECTIVENESS_CEILING
  const ceiling = Math.min(1, Math.max(baseCeiling, effectiveness + CEILING_MARGIN))
  const idealEffectiveness = effectiveness / ceiling
  const rhoLog = input.options?.coolingAirDensityKgM3 ?? dryAirDensity(baroKpa * 1000, toK(logAmbientC), R_DRY_AIR)
  const fittedFaceM2 = faceArea(input.fittedCore)
  const unreachable = () => new SizingError('NOT_CALIBRATABLE', `An effectiveness of ${effectiveness.toFixed(2)} is more than a ${input.fittedCore.faceWidthMm} × ${input.fittedCore.faceHeightMm} mm core can reach with the cooling air it gets at ${calibrationRoadKmh.toFixed(0)} km/h. Check the core recorded for this log and its sensors.`)
  let calibration: ReturnType<typeof calibrateUa>
  try {
    calibration = calibrateUa({ effectiveness: idealEffectiveness, chargeMassFlowKgS: flow.massFlowKgS, coolingMassFlowKgS: rhoLog * calibrationAirMS * fittedFaceM2 })
  }
  catch (error) {
    // calibrateUa refuses an effectiveness the cooling air cannot give: said here in the sizing's words.
    if (error instanceof LogImportError && error.code === 'IMPOSSIBLE_INPUT') throw unreachable()
    throw error
  }
  if (!Number.isFinite(calibration.ua) || calibration.ua <= 0) throw unreachable()
  const reference: ScaleReference = { ua: calibration.ua, core: input.fittedCore, chargeMassFlowKgS: flow.massFlowKgS, airSpeedMS: calibrationAirMS }

  // Design point.
  const design = input.design
  const boostKpa = design.boostKpaAbs ?? flow.manifoldKpa
  if (boostKpa === null || boostKpa <= baroKpa + 5) {
    throw new SizingError('BAD_DESIGN', 'The log shows no boost to design for. Enter the design boost as an absolute manifold pressure above the barometric pressure.')
  }
  const roadKmh = design.roadSpeedKmh ?? logRoadKmh ?? DEFAULT_ROAD_SPEED_KMH
  let designFlow = flow.massFlowKgS * boostKpa / (flow.manifoldKpa ?? boostKpa)
  let designFlowSource: 'log' | 'power' = 'log'
  if (design.targetPowerKw !== undefined) {
    const fuel = FULL_LOAD_FUEL[input.engine.fuel]
    // ṁ_air = P·BSFC·λ·AFR_s (definition of BSFC and λ, reference sheet §8.1; figures common practice).
    designFlow = massFlowFromPower({ powerKw: design.targetPowerKw, bsfc: fuel.bsfcKgPerKwh, afrStoich: fuel.afrStoich, lambda: fuel.lambda })
    designFlowSource = 'power'
  }
  const etaLog = logCompressorEfficiency(pulls, baroKpa)
  const eta = etaLog ?? DEFAULT_COMPRESSOR_EFFICIENCY
  const ambientK = toK(design.ambientC)
  // Pressure ratio taken as manifold/barometric: intake restriction and core drop left out.
  const chargeInK = compressorOutletTempK(ambientK, boostKpa / baroKpa, eta)
  const airMS = toSI(roadKmh, 'km/h') * speedRatio
  const rhoDesign = input.options?.coolingAirDensityKgM3
  const predict = (core: SizingCore) => {
    const ideal = predictCore({
      ua: scaledUa(reference, core, designFlow, airMS),
      faceAreaM2: faceArea(core),
      chargeMassFlowKgS: designFlow,
      coolingAirSpeedMS: airMS,
      chargeInK,
      ambientK,
      coolingAirDensityKgM3: rhoDesign,
      ambientPressurePa: baroKpa * 1000,
    })
    // What the manifold sensor would read: the installation takes its share (step 7).
    const read = ceiling * ideal.chargeSideEffectiveness
    return { ua: ideal.ua, effectiveness: read, chargeOutK: chargeInK - read * (chargeInK - ambientK) }
  }
  const fitted = predict(input.fittedCore)
  const fittedDrop = pressureDropKpa(designFlow, input.fittedCore)
  const boostPa = boostKpa * 1000

  const rows = input.candidates.map((core) => {
    const p = predict(core)
    const drop = pressureDropKpa(designFlow, core)
    // Equal manifold pressure: ρ ∝ 1/T (ideal gas, reference sheet §7).
    const densityGain = fitted.chargeOutK / p.chargeOutK - 1
    // Same compressor outlet pressure: the manifold sees p − Δp, so extra drop eats into the gain
    // (ρ_out/ρ_in = (p_out/p_in)·(T_in/T_out), §9). Power by the density law, an upper bound (§7).
    const powerGain = ((boostPa - drop * 1000) / (boostPa - fittedDrop * 1000)) * (fitted.chargeOutK / p.chargeOutK) - 1
    return { core, p, drop, densityGain, powerGain }
  })
  const ordered = [...rows].sort((a, b) => b.powerGain - a.powerGain || a.drop - b.drop || a.core.id - b.core.id)
  const candidates = ordered.map((row, index): SizingCandidate => {
    const chargeTempC = row.p.chargeOutK - KELVIN_OFFSET
    const dropChange = row.drop - fittedDrop
    return {
      coreId: row.core.id,
      name: row.core.name,
      uaWPerK: round(row.p.ua, 1),
      predictedEffectiveness: round(row.p.effectiveness, 3),
      chargeTempC: round(chargeTempC, 1),
      densityGainPct: round(row.densityGain * 100, 1),
      powerRecoveredPct: round(row.powerGain * 100, 1),
      powerRecoveredKw: design.targetPowerKw !== undefined ? round(row.powerGain * design.targetPowerKw, 1) : null,
      pressureDropKpa: round(row.drop, 1),
      pressureDropChangeKpa: round(dropChange, 1),
      rank: index + 1,
      reason: reasonFor(index + 1, ordered.length, row.core, input.fittedCore, chargeTempC, design.ambientC, row.powerGain * 100, dropChange),
    }
  })

  return {
    calibration: {
      fittedCoreId: input.fittedCore.id,
      uaWPerK: round(calibration.ua, 1),
      effectiveness: round(effectiveness, 3),
      effectivenessSource,
      effectivenessCeiling: round(ceiling, 3),
      idealEffectiveness: round(idealEffectiveness, 3),
      chargeMassFlowKgS: round(flow.massFlowKgS, 4),
      massFlowSource: flow.source,
      volumetricEfficiency: flow.source === 'speed-density' ? volumetricEfficiency : null,
      roadSpeedKmh: round(calibrationRoadKmh, 1),
      coolingAirSpeedMS: round(calibrationAirMS, 2),
      ntu: round(calibration.ntu, 3),
      cr: round(calibration.cr, 3),
      pullCount: pulls.length,
      logAmbientC: round(logAmbientC, 1),
    },
    design: {
      ambientC: design.ambientC,
      boostKpaAbs: round(boostKpa, 1),
      roadSpeedKmh: round(roadKmh, 1),
      targetPowerKw: design.targetPowerKw ?? null,
      chargeMassFlowKgS: round(designFlow, 4),
      massFlowSource: designFlowSource,
      compressorEfficiency: round(eta, 3),
      compressorEfficiencySource: etaLog !== null ? 'log' : 'default',
      compressorOutletC: round(chargeInK - KELVIN_OFFSET, 1),
      fittedChargeTempC: round(fitted.chargeOutK - KELVIN_OFFSET, 1),
      fittedEffectiveness: round(fitted.effectiveness, 3),
      fittedPressureDropKpa: round(fittedDrop, 1),
    },
    candidates,
    assumptions: assumptionsFor(effectivenessSource, flow.source, volumetricEfficiency, speedRatio, designFlowSource, etaLog, logRoadKmh === null, pulls.length, baseCeiling, ceiling),
  }
}

function reasonFor(rank: number, count: number, core: SizingCore, fitted: SizingCore, chargeTempC: number, ambientC: number, gainPct: number, dropChangeKpa: number): string {
  const overAmbient = `${(chargeTempC - ambientC).toFixed(0)} K over ambient`
  const drop = Math.abs(dropChangeKpa) < 0.5 ? 'about the same pressure drop' : dropChangeKpa < 0 ? `${Math.abs(dropChangeKpa).toFixed(1)} kPa less pressure drop` : `${dropChangeKpa.toFixed(1)} kPa more pressure drop`
  if (core.id === fitted.id) return `${ordinal(rank)} of ${count}: this is the core fitted when the log was made, the baseline the others are measured against (${overAmbient}).`
  if (gainPct < 0) return `${ordinal(rank)} of ${count}: it would run the charge hotter or lose more to pressure drop than the fitted core (${overAmbient}, ${drop}), so it is no uprate.`
  const lead = rank === 1 ? 'Best' : `${ordinal(rank)} of ${count}`
  const margin = gainPct < MARGINAL_GAIN_PCT ? ', a gain within normal dyno run-to-run spread' : ''
  return `${lead}: holds the charge ${overAmbient} for about ${gainPct.toFixed(1)} % more power than the fitted core with ${drop}${margin}.`
}

const ordinal = (n: number) => `${n}${n % 10 === 1 && n % 100 !== 11 ? 'st' : n % 10 === 2 && n % 100 !== 12 ? 'nd' : n % 10 === 3 && n % 100 !== 13 ? 'rd' : 'th'}`

function assumptionsFor(effectivenessSource: 'measured' | 'estimated', flowSource: 'maf' | 'speed-density', volumetricEfficiency: number, speedRatio: number,
  designFlowSource: 'log' | 'power', etaLog: number | null, roadFromDesign: boolean, pullCount: number, baseCeiling: number, ceiling: number): string[] {
  return [
    effectivenessSource === 'measured'
      ? `The fitted core's effectiveness is the mean of ${pullCount} ${pullCount === 1 ? 'pull' : 'pulls'} measured with a pre-cooler sensor; heat soak is included, so its UA is on the low side.`
      : `The log has no pre-cooler temperature: the fitted core's effectiveness (mean of ${pullCount} ${pullCount === 1 ? 'pull' : 'pulls'}) is an estimate from the compressor relation, and so is everything calibrated from it.`,
    flowSource === 'maf'
      ? 'Air mass flow: the mean of the log\'s air mass flow over the pulls.'
      : `Air mass flow by speed-density from engine size, engine speed, boost and charge temperature, with a volumetric efficiency of ${volumetricEfficiency.toFixed(2)} (Heywood 1988 §2.10, section from memory; 0.85–1.0 is common practice for a boosted engine).`,
    `Cooling air through the core at ${Math.round(speedRatio * 100)} % of road speed (common practice, no source)${roadFromDesign ? '; the log has no road speed, so the design road speed stands in for it' : ''}.`,
    'Each core\'s heat conductance (UA) is the fitted core\'s split into equal charge-side and air-side halves (common practice, no source), each scaled by core volume (same fin and tube pitch) and by its stream\'s speed: charge side h ∝ Re^0.8 (Dittus–Boelter, Incropera et al. §8.5, from memory), air side h ∝ Re^0.5 (laminar fins, Incropera §7.2, from memory). A deeper core slows the charge air, so it gains less than its volume suggests.',
    'Crossflow core, both streams unmixed, steady state, c_p 1005 J/(kg·K) (ε-NTU, Incropera et al. 6th ed. §11.4, section from memory).',
    ceiling <= baseCeiling
      ? `On the road no core reads what an ideal one would: part of its face gets little air behind the bumper beam and number plate, the air arriving is warmer than the ambient reading, and the charge picks heat up again after the core. Every core is taken to read ${ceiling.toFixed(2)} × the ideal core's effectiveness (common practice, no source: large front-mounts seldom read above about 0.9 on the road, from memory); the log is read the same way, so the fitted core comes out as measured.`
      : `On the road no core reads what an ideal one would; every core is taken to read ${ceiling.toFixed(2)} × the ideal core's effectiveness, raised from ${baseCeiling.toFixed(2)} because this log itself read ${(ceiling - CEILING_MARGIN).toFixed(2)} (common practice, no source).`,
    designFlowSource === 'power'
      ? 'Design air mass flow from the target power with full-load fuel use and mixture figures (common practice, no source).'
      : 'Design air mass flow scaled from the log by boost.',
    etaLog !== null
      ? `Pre-cooler temperature (the air leaving the turbo) from the pressure ratio with an efficiency of ${etaLog.toFixed(2)} backed out of the log's pre-cooler readings.`
      : `Pre-cooler temperature (the air leaving the turbo) from the pressure ratio with an assumed efficiency of ${DEFAULT_COMPRESSOR_EFFICIENCY.toFixed(2)} (common practice, no source).`,
    'Density gain at equal manifold pressure (ideal gas); power recovered by the density law, an upper bound, less the pressure-drop change at the same compressor pressure.',
    `Pressure drop ∝ air flow² × depth ÷ face area (common practice, no source), anchored at ${PRESSURE_DROP_ANCHOR.dropKpa} kPa for a 600 × 300 × 76 mm core at ${PRESSURE_DROP_ANCHOR.massFlowKgS} kg/s.`,
  ]
}
