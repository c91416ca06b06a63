import psychrolib from 'psychrolib'
import { describe, expect, it } from 'vitest'
import {
  chargeDewPointC,
  chargeVapourPressurePa,
  densityRatio,
  densityRatioIsa,
  dewPointCFromVapourPressure,
  dryAirDensity,
  humidAir,
  humidityRatioFromVapourPressure,
  pressureDropDensityFactor,
  R_DRY_AIR_ASHRAE,
  saturationVapourPressurePa,
} from '../../../server/analysis/physics'

psychrolib.SetUnitSystem(psychrolib.SI)

const rel = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected)
const K = (tC: number) => tC + 273.15

describe('dry-air density, ρ = p/(R·T)', () => {
  // Reference sheet §2.1 (COMPUTED) with R = 287.05287 (ISO 2533) and R = 287.042 (ASHRAE/psychrolib).
  it.each([
    [20, 101325, 1.204106, 1.204152],
    [15, 101325, 1.225000, 1.225046],
    [0, 101325, 1.292271, 1.292320],
    [25, 100000, 1.168432, 1.168476],
    [40, 220000, 2.447419, 2.447512],
    [45, 220000, 2.408956, 2.409047],
    [130, 220000, 1.901053, 1.901125],
  ])('%d °C, %d Pa (RHO-D, COMPUTED)', (tC, pPa, rhoIso, rhoAshrae) => {
    expect(rel(dryAirDensity(pPa, K(tC)), rhoIso)).toBeLessThan(1e-6)
    expect(rel(dryAirDensity(pPa, K(tC), R_DRY_AIR_ASHRAE), rhoAshrae)).toBeLessThan(1e-6)
  })

  it('with the ASHRAE constant equals psychrolib GetDryAirDensity (independent implementation)', () => {
    for (const [tC, pPa] of [[20, 101325], [15, 101325], [30, 101325], [40, 220000]] as const) {
      expect(rel(dryAirDensity(pPa, K(tC), R_DRY_AIR_ASHRAE), psychrolib.GetDryAirDensity(tC, pPa))).toBeLessThan(1e-12)
    }
    expect(psychrolib.GetDryAirDensity(20, 101325)).toBeCloseTo(1.204151875737117, 12)
  })
})

describe('density ratios (reference sheet §5, §9)', () => {
  it('SIGMA: 220 kPa, 45 °C → σ = 1.96649 (COMPUTED)', () => {
    expect(Math.abs(densityRatioIsa(220000, K(45)) - 1.96649)).toBeLessThan(1e-5)
  })

  it('σ table at 220 kPa: 130 °C 1.55188, 60 °C 1.87795, 25 °C 2.09841 (COMPUTED)', () => {
    expect(Math.abs(densityRatioIsa(220000, K(130)) - 1.55188)).toBeLessThan(1e-5)
    expect(Math.abs(densityRatioIsa(220000, K(60)) - 1.87795)).toBeLessThan(1e-5)
    expect(Math.abs(densityRatioIsa(220000, K(25)) - 2.09841)).toBeLessThan(1e-5)
  })

  it('DENS-45/60: 45 °C vs 60 °C at equal pressure → ×1.047148 (ideal gas, COMPUTED)', () => {
    expect(Math.abs(densityRatio(220000, K(45), 220000, K(60)) - 1.047148)).toBeLessThan(1e-6)
  })

  it('DP-10: 230 kPa in, Δp 10 kPa → pressure density factor 0.956522 (COMPUTED)', () => {
    expect(Math.abs(pressureDropDensityFactor(230000, 10000) - 0.956522)).toBeLessThan(1e-6)
    expect(pressureDropDensityFactor(230000, 5000)).toBeCloseTo(0.97826, 5)
    expect(pressureDropDensityFactor(230000, 20000)).toBeCloseTo(0.91304, 5)
  })
})

describe('saturation vapour pressure, Hyland–Wexler (ASHRAE 2017 ch. 1 eq. 5/6)', () => {
  // Exact psychrolib 1.1.1 outputs recorded in the reference sheet §2.4 (COMPUTED).
  it.each([
    [0, 611.1535708907679],
    [20, 2338.8037000739814],
    [25, 3169.2164701436277],
    [28, 3782.206967928972],
    [30, 4246.030243592604],
    [35, 5627.819446540259],
    [40, 7383.46000898612],
    [50, 12349.856466723748],
    [60, 19943.760621620728],
  ])('%d °C (psychrolib GetSatVapPres as recorded, PSAT)', (tC, pPa) => {
    expect(rel(saturationVapourPressurePa(tC), pPa)).toBeLessThan(1e-6)
  })

  it('agrees with psychrolib GetSatVapPres over −60…150 °C, water and ice branches (independent implementation)', () => {
    for (let tC = -60; tC <= 150; tC += 2.5) {
      expect(rel(saturationVapourPressurePa(tC), psychrolib.GetSatVapPres(tC))).toBeLessThan(1e-12)
    }
  })

  it('PSAT-20: within 0.1 % of Buck 1981 (2337.28 Pa, reference sheet §2.3) — the formulas agree to ±0.4 %', () => {
    expect(rel(saturationVapourPressurePa(20), 2337.28)).toBeLessThan(1e-3)
  })
})

describe('humid air (ASHRAE 2017 ch. 1 eqs. 11, 20, 26) against psychrolib', () => {
  it('RHO-H1: 30 °C, 50 % RH, 101 325 Pa → W 0.0133102038, moist ρ 1.1552069', () => {
    const state = humidAir({ pPa: 101325, tK: K(30), relativeHumidity: 0.5, dryAirGasConstant: R_DRY_AIR_ASHRAE })
    const w = psychrolib.GetHumRatioFromRelHum(30, 0.5, 101325)
    expect(rel(state.humidityRatio, w)).toBeLessThan(1e-9)
    expect(rel(state.humidityRatio, 0.01331020383863019)).toBeLessThan(1e-9)
    expect(rel(state.vapourPressurePa, psychrolib.GetVapPresFromRelHum(30, 0.5))).toBeLessThan(1e-12)
    expect(rel(state.moistDensity, psychrolib.GetMoistAirDensity(30, w, 101325))).toBeLessThan(1e-7)
    expect(rel(state.moistDensity, 1.155206874511325)).toBeLessThan(1e-7)
  })

  it('RHO-H2: 20 °C, 50 % RH → moist ρ 1.1988980 (psychrolib)', () => {
    const state = humidAir({ pPa: 101325, tK: K(20), relativeHumidity: 0.5, dryAirGasConstant: R_DRY_AIR_ASHRAE })
    const w = psychrolib.GetHumRatioFromRelHum(20, 0.5, 101325)
    expect(rel(state.moistDensity, psychrolib.GetMoistAirDensity(20, w, 101325))).toBeLessThan(1e-7)
    expect(rel(state.moistDensity, 1.1988979666684412)).toBeLessThan(1e-7)
  })

  it('with the app-wide ISO gas constant stays within 6e-5 of psychrolib (tolerance from reference sheet §2.4)', () => {
    const state = humidAir({ pPa: 101325, tK: K(30), relativeHumidity: 0.5 })
    expect(rel(state.moistDensity, 1.155206874511325)).toBeLessThan(6e-5)
  })

  it('RH = 0 reduces to dry-air density; humid air is lighter than dry air', () => {
    const dry = humidAir({ pPa: 101325, tK: K(30), relativeHumidity: 0 })
    expect(rel(dry.moistDensity, dryAirDensity(101325, K(30)))).toBeLessThan(1e-14)
    const wet = humidAir({ pPa: 101325, tK: K(30), relativeHumidity: 0.9 })
    expect(wet.moistDensity).toBeLessThan(dry.moistDensity)
    expect(wet.dryAirPartialDensity).toBeLessThan(wet.moistDensity)
  })

  it('charge at 40 °C, 220 kPa with the ambient 30 °C/50 % moisture: moist 2.42812, dry partial 2.39623 (psychrolib / COMPUTED)', () => {
    const w = psychrolib.GetHumRatioFromRelHum(30, 0.5, 101325)
    const pv = chargeVapourPressurePa(psychrolib.GetVapPresFromRelHum(30, 0.5), 101325, 220000)
    const state = humidAir({ pPa: 220000, tK: K(40), relativeHumidity: pv / saturationVapourPressurePa(40), dryAirGasConstant: R_DRY_AIR_ASHRAE })
    expect(rel(state.humidityRatio, w)).toBeLessThan(1e-9)
    expect(rel(state.moistDensity, psychrolib.GetMoistAirDensity(40, w, 220000))).toBeLessThan(1e-7)
    expect(state.moistDensity).toBeCloseTo(2.42812, 5)
    expect(state.dryAirPartialDensity).toBeCloseTo(2.39623, 5)
  })
})

describe('vapour in the boosted charge (reference sheet §2.2)', () => {
  it('DEW-B: p_v 4609.557 Pa and dew point 31.439 °C at 220 kPa (psychrolib GetVapPresFromHumRatio, GetTDewPointFromHumRatio)', () => {
    const w = psychrolib.GetHumRatioFromRelHum(30, 0.5, 101325)
    const pv = chargeVapourPressurePa(psychrolib.GetVapPresFromRelHum(30, 0.5), 101325, 220000)
    expect(rel(pv, psychrolib.GetVapPresFromHumRatio(w, 220000))).toBeLessThan(1e-9)
    expect(Math.abs(pv - 4609.557)).toBeLessThan(1e-3)
    const dewC = chargeDewPointC({ ambientPressurePa: 101325, ambientTempK: K(30), relativeHumidity: 0.5, chargePressurePa: 220000 })
    expect(Math.abs(dewC - psychrolib.GetTDewPointFromHumRatio(40, w, 220000))).toBeLessThan(1e-4)
    expect(Math.abs(dewC - 31.439)).toBeLessThan(1e-3)
  })

  it('ambient dew point 30 °C / 50 % → 18.4466 °C (psychrolib GetTDewPointFromRelHum)', () => {
    const dewC = dewPointCFromVapourPressure(psychrolib.GetVapPresFromRelHum(30, 0.5))
    expect(Math.abs(dewC - psychrolib.GetTDewPointFromRelHum(30, 0.5))).toBeLessThan(1e-4)
    expect(Number.isNaN(dewPointCFromVapourPressure(0))).toBe(true)
  })

  it('humidity ratio is kept by compression: W at 220 kPa equals the ambient 0.0133102038 (psychrolib GetHumRatioFromRelHum(30, 0.5, 101325))', () => {
    // The expected W comes from psychrolib at the ambient state, not from this code run backwards.
    const pv = psychrolib.GetVapPresFromRelHum(30, 0.5)
    const after = humidityRatioFromVapourPressure(chargeVapourPressurePa(pv, 101325, 220000), 220000)
    expect(rel(after, 0.01331020383863019)).toBeLessThan(1e-9)
  })
})
