// One demo pull pinned end to end against values worked by hand from the reference sheet's
// relations and constants. The inputs are the pull's logged means read straight from the demo
// CSV (not from the engine), so the working below is independent of the engine's code; only the
// pull's window (240.3–246.9 s) is taken from the pull finder.
import psychrolib from 'psychrolib'
import { describe, expect, it } from 'vitest'
import { analyseLog, generateDemoLog, importLog } from '../../../server/analysis/index'

psychrolib.SetUnitSystem(psychrolib.SI)

const demo = generateDemoLog('stock-core-hot-day')
const rows = demo.csv.trim().split('\n').slice(1).map(line => line.split(',').map(Number))
const column = (name: string) => demo.csv.slice(0, demo.csv.indexOf('\n')).split(',').indexOf(name)
// Mean of a column over a pull's samples (the window includes both ends).
const loggedMean = (name: string, fromS: number, toS: number) => {
  const c = column(name)
  const inside = rows.filter(row => row[0]! >= fromS && row[0]! <= toS)
  return { n: inside.length, mean: inside.reduce((sum, row) => sum + row[c]!, 0) / inside.length }
}

// Conditions entered as a tuner would: the demo log has no barometric or humidity column.
const BARO_KPA = 100.5
const RH = 0.40

describe('pull 5 of the stock-core demo (the hottest), worked by hand', () => {
  it('takes its inputs from the logged means: boost 213.6821 kPa, charge 63.1328 °C, ambient 31.1910 °C', () => {
    // 67 samples at 10 Hz from 240.3 to 246.9 s; pull 1 (60.3–66.9 s) is the coolest.
    expect(loggedMean('Manifold pressure abs (kPa)', 240.3, 246.9)).toEqual({ n: 67, mean: expect.closeTo(213.6821, 4) })
    expect(loggedMean('Charge air temp (°C)', 240.3, 246.9).mean).toBeCloseTo(63.1328, 4)
    expect(loggedMean('Ambient temp (°C)', 240.3, 246.9).mean).toBeCloseTo(31.1910, 4)
    expect(loggedMean('Pre-cooler temp (°C)', 240.3, 246.9).mean).toBeCloseTo(119.3821, 4)
    expect(loggedMean('Charge air temp (°C)', 60.3, 66.9).mean).toBeCloseTo(53.1418, 4)
  })

  // Hand working (T in K = °C + 273.15; sheet §1.1, §2.2, §4, §5, §7):
  //   T_charge = 336.2828 K, T_amb = 304.3410 K, T_coolest (pull 1) = 326.2918 K, T_pre,logged = 392.5321 K
  //   PR = 213.6821 / 100.5 = 2.126190            (boost over entered barometric pressure)
  //   PR^((γ−1)/γ) = 2.126190^0.285714 = 1.240511 (γ = 1.4, sheet §1.1)
  //   T_pre,est = 304.3410 · (1 + 0.240511/0.70) = 304.3410 · 1.343587 = 408.9087 K = 135.759 °C
  //                                              (§4 compressor relation, η_c 0.70: the engine's stated default)
  //   ε_est = (408.9087 − 336.2828)/(408.9087 − 304.3410) = 72.6258/104.5676 = 0.694535 (§5)
  //   ε_measured = (392.5321 − 336.2828)/(392.5321 − 304.3410) = 56.2493/88.1910 = 0.637811 (§5)
  //   σ = (213.6821/101.325) · (288.15/336.2828) = 2.108878 · 0.856868 = 1.807030 (§5, vs ISA sea level)
  //   loss vs coolest pull = 1 − 326.2918/336.2828 = 2.9710 %  (§7 density law)
  //   loss vs charge at ambient = 1 − 304.3410/336.2828 = 9.4985 %
  //   dew point: p_ws(31.191 °C) = 4545.11 Pa (psychrolib GetSatVapPres, ASHRAE 2017 ch. 1);
  //     p_v = 0.40 · 4545.11 = 1818.04 Pa; compressed with the air (§2.2, W kept):
  //     p_v,charge = 1818.04 · 213.6821/100.5 = 3865.51 Pa → dew point 28.374 °C (psychrolib GetTDewPointFromVapPres)
  it('the hand working holds together (each step recomputed from the line above)', () => {
    const prPower = Math.pow(213.6821 / 100.5, 0.4 / 1.4)
    expect(prPower).toBeCloseTo(1.240511, 6)
    expect(304.3410 * (1 + (prPower - 1) / 0.70)).toBeCloseTo(408.9087, 3)
    expect(72.6258 / 104.5676).toBeCloseTo(0.694535, 5)
    expect(56.2493 / 88.1910).toBeCloseTo(0.637811, 5)
    expect((213.6821 / 101.325) * (288.15 / 336.2828)).toBeCloseTo(1.807030, 5)
    const pvCharge = RH * psychrolib.GetSatVapPres(31.1910) * 213.6821 / BARO_KPA
    expect(pvCharge).toBeCloseTo(3865.51, 1)
    expect(psychrolib.GetTDewPointFromVapPres(60, pvCharge)).toBeCloseTo(28.374, 3)
  })

  it('the engine agrees when it must estimate the pre-cooler temperature', async () => {
    const log = await importLog(demo.csv, { mapping: { preCoolerTemp: null } })
    const pull = analyseLog(log, { baroKpa: BARO_KPA, humidityPct: RH * 100 }).pulls[4]!
    expect(pull).toMatchObject({ startS: 240.3, endS: 246.9, effectivenessSource: 'estimated' })
    // The engine rounds temperatures to 0.01 K, ratios to 4 digits and losses to 3.
    expect(pull.meanManifoldKpa).toBeCloseTo(213.68, 2)
    expect(pull.meanChargeTempC).toBeCloseTo(63.13, 2)
    expect(pull.ambientTempC).toBeCloseTo(31.19, 2)
    expect(pull.preCoolerTempC).toBeCloseTo(135.76, 2)
    expect(pull.effectiveness).toBeCloseTo(0.6945, 4)
    expect(pull.densityRatioIsa).toBeCloseTo(1.8070, 4)
    // "Loss against the coolest pull" is made fair: each pull's charge temperature is restated at
    // the pulls' mean ambient and middle pressure ratio, keeping its share (1 − ε) of the
    // compressor's rise (sheet §4, §5), then the density law (sheet §7). Worked by hand from the
    // logged means (see 'the restated loss, worked by hand' below): 2.9099 %.
    // (Before the restating, the bare density ratio gave 2.971 %.)
    const analysis = analyseLog(log, { baroKpa: BARO_KPA, humidityPct: RH * 100 })
    expect(analysis.summary.lossNormalisation).toMatchObject({ method: 'ambient-and-boost', referenceAmbientC: 31.13, referencePressureRatio: 2.124 })
    expect(pull.powerLossVsCoolestPct).toBeCloseTo(2.910, 3)
    expect(analysis.pulls[0]!.powerLossVsCoolestPct).toBe(0)
    expect(pull.powerLossVsAmbientPct).toBeCloseTo(9.498, 3)
    expect(pull.chargeDewPointC).toBeCloseTo(28.37, 2)
  })

  // The restated loss, worked by hand from the six pulls' logged means (windows from the pull finder):
  //   pull  ambient °C  boost kPa   PR = boost/100.5   charge °C
  //     1    31.0418    213.4582    2.123962          53.1418   (the coolest)
  //     2    31.0612    213.2284    2.121676          54.9582
  //     3    31.1075    213.2612    2.122002          57.9418
  //     4    31.1478    213.5090    2.124468          61.4403
  //     5    31.1910    213.6821    2.126190          63.1328
  //     6    31.2403    213.4955    2.124334          62.7776
  //   T_ref = mean ambient = 186.7896/6 = 31.1316 °C = 304.2816 K
  //   PR_ref = the middle of the six sorted ratios; with an even count the engine takes the upper
  //            of the two middle ones: 2.124334 (pull 6)
  //   rise(T1, PR) = T1 · (PR^0.285714 − 1) / 0.70                              (sheet §4, η_c 0.70)
  //   rise(T_ref, PR_ref) = 304.2816 · 0.2402013 / 0.70 = 104.4126 K
  //   pull 1: rise(304.1918 K, 2.123962) = 304.1918 · 0.2401394 / 0.70 = 104.3549 K
  //           T_n = 304.2816 + (53.1418 − 31.0418) · 104.4126/104.3549 = 304.2816 + 22.1000 · 1.000553 = 326.3938 K
  //   pull 5: rise(304.3410 K, 2.126190) = 304.3410 · 0.2405109 / 0.70 = 104.5676 K
  //           T_n = 304.2816 + (63.1328 − 31.1910) · 104.4126/104.5676 = 304.2816 + 31.9418 · 0.998518 = 336.1761 K
  //   (pulls 2, 3, 4, 6 restate to 328.23, 331.16, 334.57, 335.81 K: pull 1 stays the coolest)
  //   loss of pull 5 vs the coolest = 1 − 326.3938/336.1761 = 2.9099 %          (sheet §7 density law)
  it('the restated loss, worked by hand', () => {
    const ambients = [31.0418, 31.0612, 31.1075, 31.1478, 31.1910, 31.2403]
    const windows = [[60.3, 66.9], [105.3, 111.9], [150.3, 156.9], [195.3, 201.9], [240.3, 246.9], [285.3, 291.9]] as const
    windows.forEach(([from, to], i) => expect(loggedMean('Ambient temp (°C)', from, to).mean).toBeCloseTo(ambients[i]!, 4))
    expect(loggedMean('Manifold pressure abs (kPa)', 285.3, 291.9).mean / BARO_KPA).toBeCloseTo(2.124334, 6)
    expect(loggedMean('Manifold pressure abs (kPa)', 60.3, 66.9).mean / BARO_KPA).toBeCloseTo(2.123962, 6)
    expect(ambients.reduce((a, b) => a + b, 0) / 6 + 273.15).toBeCloseTo(304.2816, 4)
    const rise = (t1K: number, pr: number) => t1K * (pr ** (0.4 / 1.4) - 1) / 0.70
    expect(rise(304.2816, 2.124334)).toBeCloseTo(104.4126, 3)
    expect(rise(304.1918, 2.123962)).toBeCloseTo(104.3549, 3)
    expect(rise(304.3410, 2.126190)).toBeCloseTo(104.5676, 3)
    expect(304.2816 + 22.1000 * 104.4126 / 104.3549).toBeCloseTo(326.3938, 3)
    expect(304.2816 + 31.9418 * 104.4126 / 104.5676).toBeCloseTo(336.1761, 3)
    expect((1 - 326.3938 / 336.1761) * 100).toBeCloseTo(2.9099, 4)
  })

  it('the engine agrees with the measured pre-cooler temperature too', async () => {
    const pull = analyseLog(await importLog(demo.csv), { baroKpa: BARO_KPA }).pulls[4]!
    expect(pull.effectivenessSource).toBe('measured')
    expect(pull.preCoolerTempC).toBeCloseTo(119.38, 2)
    expect(pull.effectiveness).toBeCloseTo(0.6378, 4)
  })
})
