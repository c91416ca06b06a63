import { describe, expect, it } from 'vitest'
import { CEILING_MARGIN, isSizingError, ROAD_EFFECTIVENESS_CEILING, sizeCores, type SizingInput, type SizingPull } from '../../../server/analysis/sizing'

// Hand-worked example built from the reference sheet's check values. The first block works the
// ideal core (effectivenessCeiling 1), which is exactly the reference sheet's CORE-1; the second
// block works the same example with the road ceiling of 0.9 that the model uses by default (issue 9).
//
// - SD-1 (§8.2): 2.0 L four-stroke, 4000 min⁻¹, MAP 220 kPa abs, charge 40 °C, η_v 0.95 →
//   ρ_man = 220 000/(287.05287·313.15) = 2.44742 kg/m³, ṁ = 0.95·2.44742·0.002·4000/120 = 0.15500 kg/s
//   (speed-density, Heywood 1988 §2.10, section from memory).
// - CORE-1 (§6.3): face 0.60 × 0.30 m, 4.0 m/s through the core, ρ 1.18 → ṁ_c 0.8496 kg/s,
//   C_h 155.775, C_c 853.848 W/K, Cr 0.18244; UA 350 W/K → NTU 2.24683, ε 0.84501 (crossflow, both
//   unmixed: Mason series / Kays & London, confirmed against the Triboix integral); T_h,in 129.63 °C
//   (§4: 25 °C, PR 2.2, η_c 0.72), T_h,out 41.22 °C.
// Road speed 57.6 km/h × 0.25 (our through-core share) = 4.0 m/s; barometer 100 kPa so PR = 2.2.
// The log's pre-cooler temperature 129.63 °C at 25 °C ambient backs out η_c = 0.72 (§4).
// Candidate figures COMPUTED independently in Python with scipy.special.gammainc (the same series):
// UA scaling: 1/UA = 1/hA_charge + 1/hA_air, equal halves in the calibration (hA = 2·UA = 700 W/K
// each, common practice, no source), each ∝ volume × speed^n (charge n = 0.8 Dittus–Boelter, air
// n = 0.5 laminar fins; Incropera §8.5 and §7.2, from memory).
// - 600 × 300 × 114 mm: volume ×1.5, charge flow area (height × depth) ×1.5 so charge speed ÷1.5:
//   hA_charge = 700·1.5·1.5^−0.8 = 759.2, hA_air = 700·1.5 = 1050 → UA 440.6 W/K, NTU 2.8284,
//   Cr 0.18244 → ε 0.89514, T 35.97 °C; density gain 314.366/309.122 − 1 = 1.70 %;
//   Δp ∝ ṁ²·depth/area (common practice, no source) anchored at 8 kPa for 600 × 300 × 76 at
//   0.155 kg/s → 12.0 kPa (+4.0 kPa); power at the same compressor pressure
//   ((220 − 12.0)/(220 − 8.0))·1.01697 − 1 = −0.22 %: deeper is no uprate here.
// - 700 × 300 × 76 mm: volume ×1.1667, same charge flow area and speeds → UA = 350·1.1667 =
//   408.34 W/K, cooling air 1.18·4·0.21 → Cr 0.15638, ε 0.88682, T 36.84 °C, density gain 1.41 %,
//   Δp 6.86 kPa (−1.14 kPa), power 1.96 %.
//
// With the road ceiling 0.9 (ROAD_EFFECTIVENESS_CEILING: common practice, no source; see sizing.ts):
// - the log read 0.84501, so the ideal core behind it gave 0.84501/0.9 = 0.93890; Cr is still
//   0.18244 and the charge is C_min, so NTU = 3.69699 (exact crossflow series inverted with scipy's
//   brentq) and UA = 3.69699·155.775 = 575.90 W/K. An independent check that shares no code with the
//   series: marching the two unmixed streams over an 800 × 800 grid of cells gives ε 0.93890 at
//   that NTU.
// - fitted core at design: 0.9·0.93890 = 0.84501 read, 41.22 °C as measured (the ceiling cancels).
// - 600 × 300 × 114: hA halves 2·575.90 = 1151.80 W/K; hA_charge = 1151.80·1.5·1.5^−0.8 = 1249.2,
//   hA_air = 1727.7 → UA 724.96 W/K, NTU 4.65389 → ideal ε 0.96475, read 0.9·0.96475 = 0.86828,
//   T = 129.63 − 0.86828·104.63 = 38.78 °C; density gain 314.367/311.932 − 1 = 0.78 %; Δp +4.0 kPa
//   as before; power ((220 − 12)/(220 − 8))·1.00780 − 1 = −1.12 %.
// - 700 × 300 × 76: UA 575.90·7/6 = 671.88 W/K, NTU 4.31315, Cr 0.15638 → ideal ε 0.96227, read
//   0.86604, T 39.02 °C, density gain 0.71 %, Δp −1.14 kPa, power 1.248 %.
// The ceiling squeezes the gains: near the top of the curve a bigger core buys less.

const pull: SizingPull = {
  effectiveness: 0.84501,
  effectivenessSource: 'measured',
  meanManifoldKpa: 220,
  meanRpm: 4000,
  meanChargeTempC: 40,
  meanSpeedKmh: 57.6,
  ambientTempC: 25,
  preCoolerTempC: 129.63,
}

const fitted = { id: 1, name: 'Reference 600', faceWidthMm: 600, faceHeightMm: 300, depthMm: 76 }
const deep = { id: 2, name: 'Deep 600', faceWidthMm: 600, faceHeightMm: 300, depthMm: 114 }
const wide = { id: 3, name: 'Wide 700', faceWidthMm: 700, faceHeightMm: 300, depthMm: 76 }

const input = (over: Partial<SizingInput> = {}): SizingInput => ({
  engine: { displacementL: 2.0, fuel: 'petrol' },
  log: { pulls: [pull, pull], baroKpa: 100 },
  fittedCore: fitted,
  candidates: [fitted, deep, wide],
  design: { ambientC: 25, boostKpaAbs: 220, roadSpeedKmh: 57.6 },
  options: { volumetricEfficiency: 0.95, coolingAirDensityKgM3: 1.18, effectivenessCeiling: 1 },
  ...over,
})

describe('front-mount sizing, hand-worked example for the ideal core (reference sheet §6.3 CORE-1 and §8.2 SD-1)', () => {
  const result = sizeCores(input())

  it('takes the charge air flow from speed-density when the log has no MAF (SD-1: 0.15500 kg/s)', () => {
    expect(result.calibration.massFlowSource).toBe('speed-density')
    expect(result.calibration.volumetricEfficiency).toBe(0.95)
    expect(result.calibration.chargeMassFlowKgS).toBeCloseTo(0.155, 4)
  })

  it('calibrates the fitted core back to the UA of CORE-1 (350 W/K, NTU 2.24683, Cr 0.18244)', () => {
    expect(result.calibration.uaWPerK).toBeCloseTo(350, 0)
    expect(result.calibration.ntu).toBeCloseTo(2.247, 3)
    expect(result.calibration.cr).toBeCloseTo(0.182, 3)
    expect(result.calibration.coolingAirSpeedMS).toBeCloseTo(4.0, 6)
    expect(result.calibration.effectivenessSource).toBe('measured')
  })

  it('predicts the fitted core at the design point as CORE-1 does (129.63 °C in, 41.22 °C out)', () => {
    expect(result.design.compressorEfficiencySource).toBe('log')
    expect(result.design.compressorEfficiency).toBeCloseTo(0.72, 3)
    expect(result.design.compressorOutletC).toBeCloseTo(129.6, 1)
    expect(result.design.fittedChargeTempC).toBeCloseTo(41.2, 1)
    expect(result.design.fittedEffectiveness).toBeCloseTo(0.845, 3)
    expect(result.design.fittedPressureDropKpa).toBeCloseTo(8.0, 1)
  })

  it('predicts each candidate as worked by hand', () => {
    const byId = Object.fromEntries(result.candidates.map(c => [c.coreId, c]))
    expect(byId[2]).toMatchObject({ uaWPerK: 440.6, predictedEffectiveness: 0.895, chargeTempC: 36, densityGainPct: 1.7, pressureDropChangeKpa: 4, powerRecoveredPct: -0.2 })
    expect(byId[3]).toMatchObject({ uaWPerK: 408.3, predictedEffectiveness: 0.887, chargeTempC: 36.8, densityGainPct: 1.4, pressureDropChangeKpa: -1.1, powerRecoveredPct: 2 })
    expect(byId[1]).toMatchObject({ chargeTempC: 41.2, densityGainPct: 0, powerRecoveredPct: 0, pressureDropChangeKpa: 0 })
  })

  it('ranks by power recovered: the wider core first, the deeper one that costs pressure drop below the fitted core', () => {
    expect(result.candidates.map(c => c.coreId)).toEqual([3, 1, 2])
    expect(result.candidates.map(c => c.rank)).toEqual([1, 2, 3])
    expect(result.candidates[0]!.reason).toMatch(/^Best: .*1\.1 kPa less pressure drop, a gain within normal dyno run-to-run spread/)
    expect(result.candidates[1]!.reason).toMatch(/fitted when the log was made/)
    expect(result.candidates[2]!.reason).toMatch(/4\.0 kPa more pressure drop\), so it is no uprate/)
  })

  it('uses the mean MAF reading over the pulls when the log has one', () => {
    const maf = sizeCores(input({ log: { pulls: [pull], baroKpa: 100, massAirFlowKgS: 0.2 } }))
    expect(maf.calibration.massFlowSource).toBe('maf')
    expect(maf.calibration.chargeMassFlowKgS).toBe(0.2)
    expect(maf.calibration.volumetricEfficiency).toBeNull()
  })

  it('says when the effectiveness was estimated rather than measured', () => {
    const estimated = sizeCores(input({ log: { pulls: [{ ...pull, effectivenessSource: 'estimated', preCoolerTempC: 129.63 }], baroKpa: 100 } }))
    expect(estimated.calibration.effectivenessSource).toBe('estimated')
    expect(estimated.design.compressorEfficiencySource).toBe('default')
    expect(estimated.assumptions[0]).toMatch(/estimate/)
  })

  it('takes the design air flow from the target power (150 kW petrol → 0.15619 kg/s, §8.1)', () => {
    const powered = sizeCores(input({ design: { ambientC: 25, boostKpaAbs: 220, roadSpeedKmh: 57.6, targetPowerKw: 150 } }))
    expect(powered.design.massFlowSource).toBe('power')
    expect(powered.design.chargeMassFlowKgS).toBeCloseTo(0.15619, 4)
    expect(powered.candidates[0]!.powerRecoveredKw).not.toBeNull()
  })
})

describe('front-mount sizing, the same example with the road ceiling of 0.9 (the default)', () => {
  const result = sizeCores(input({ options: { volumetricEfficiency: 0.95, coolingAirDensityKgM3: 1.18 } }))

  it('calibrates the ideal core behind the log: 0.84501 read ÷ 0.9 = 0.93890, NTU 3.69699, UA 575.9 W/K', () => {
    expect(result.calibration.effectivenessCeiling).toBe(ROAD_EFFECTIVENESS_CEILING)
    expect(result.calibration.effectiveness).toBeCloseTo(0.845, 3)
    expect(result.calibration.idealEffectiveness).toBeCloseTo(0.939, 3)
    expect(result.calibration.ntu).toBeCloseTo(3.697, 3)
    expect(result.calibration.uaWPerK).toBeCloseTo(575.9, 1)
  })

  it('gives back the fitted core as measured (the ceiling cancels): 41.22 °C', () => {
    expect(result.design.fittedEffectiveness).toBeCloseTo(0.845, 3)
    expect(result.design.fittedChargeTempC).toBeCloseTo(41.2, 1)
  })

  it('predicts each candidate as worked by hand', () => {
    const byId = Object.fromEntries(result.candidates.map(c => [c.coreId, c]))
    expect(byId[2]).toMatchObject({ uaWPerK: 725, predictedEffectiveness: 0.868, chargeTempC: 38.8, densityGainPct: 0.8, pressureDropChangeKpa: 4, powerRecoveredPct: -1.1 })
    expect(byId[3]).toMatchObject({ uaWPerK: 671.9, predictedEffectiveness: 0.866, chargeTempC: 39, densityGainPct: 0.7, pressureDropChangeKpa: -1.1, powerRecoveredPct: 1.2 })
    expect(result.candidates.map(c => c.coreId)).toEqual([3, 1, 2])
  })

  it('never predicts a core reading above the ceiling, however large', () => {
    const huge = { id: 9, name: 'Huge', faceWidthMm: 1200, faceHeightMm: 600, depthMm: 150 }
    const r = sizeCores(input({ candidates: [huge], options: { volumetricEfficiency: 0.95, coolingAirDensityKgM3: 1.18 } }))
    expect(r.candidates[0]!.predictedEffectiveness).toBeLessThanOrEqual(ROAD_EFFECTIVENESS_CEILING)
    expect(r.candidates[0]!.predictedEffectiveness).toBeGreaterThan(0.89)
  })

  it('raises the ceiling for a log that reads above it, and says so', () => {
    const high = sizeCores(input({ log: { pulls: [{ ...pull, effectiveness: 0.92 }], baroKpa: 100 }, options: { volumetricEfficiency: 0.95, coolingAirDensityKgM3: 1.18 } }))
    expect(high.calibration.effectivenessCeiling).toBeCloseTo(0.92 + CEILING_MARGIN, 6)
    expect(high.design.fittedEffectiveness).toBeCloseTo(0.92, 3)
    expect(high.assumptions.join(' ')).toMatch(/raised from 0\.90 because this log itself read 0\.92/)
  })
})

describe('front-mount sizing refuses impossible input with a message, never NaN', () => {
  const refuses = (over: Partial<SizingInput>, code: string, message: RegExp) => {
    let caught: unknown
    try {
      sizeCores(input(over))
    }
    catch (error) {
      caught = error
    }
    expect(isSizingError(caught)).toBe(true)
    expect((caught as { code: string }).code).toBe(code)
    expect((caught as Error).message).toMatch(message)
  }

  it('refuses a boost at or below the barometer', () => refuses({ design: { ambientC: 25, boostKpaAbs: 100 } }, 'BAD_DESIGN', /above the barometric pressure/))
  it('refuses an ambient outside −30…55 °C', () => refuses({ design: { ambientC: 80 } }, 'BAD_DESIGN', /between −30 and 55 °C/))
  it('refuses a road speed below 20 km/h', () => refuses({ design: { ambientC: 25, roadSpeedKmh: 5 } }, 'BAD_DESIGN', /20 and 300 km\/h/))
  it('refuses a log without pulls', () => refuses({ log: { pulls: [], baroKpa: 100 } }, 'NO_PULLS', /no pulls/))
  it('refuses a log whose pulls have no effectiveness', () => refuses({ log: { pulls: [{ ...pull, effectiveness: null }], baroKpa: 100 } }, 'NO_EFFECTIVENESS', /Pick another log/))
  it('refuses a log with no way to know the air flow', () => refuses({ log: { pulls: [{ ...pull, meanRpm: null }], baroKpa: 100 } }, 'NO_MASS_FLOW', /air mass flow/))
  it('refuses an effectiveness the core cannot reach', () => refuses({ log: { pulls: [{ ...pull, effectiveness: 0.995 }], baroKpa: 100 } }, 'NOT_CALIBRATABLE', /0\.99/))
  it('refuses an effectiveness beyond what the cooling air allows', () => refuses({ options: { coolingAirDensityKgM3: 0.1, volumetricEfficiency: 0.95 } }, 'NOT_CALIBRATABLE', /more than a 600 × 300 mm core can reach/))
  it('refuses an empty candidate list', () => refuses({ candidates: [] }, 'NO_CANDIDATES', /at least one core/))

  it('never returns NaN for any plausible design point', () => {
    for (const ambientC of [-20, 0, 35, 50]) {
      for (const boostKpaAbs of [130, 250, 350]) {
        const r = sizeCores(input({ design: { ambientC, boostKpaAbs, roadSpeedKmh: 100 } }))
        for (const c of r.candidates) {
          for (const value of [c.chargeTempC, c.predictedEffectiveness, c.densityGainPct, c.powerRecoveredPct, c.pressureDropChangeKpa]) expect(Number.isFinite(value)).toBe(true)
        }
      }
    }
  })
})
