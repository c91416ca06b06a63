// Issue 10: the full-load rule, the artefact masks, the drive summary and soak events, and honest
// physics labels, on synthetic logs built for each case and on excerpts of the two real logs
// (attribution in tests/fixtures/real/README.md).
import { fileURLToPath } from 'node:url'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { analyseLog, importLog } from '../../../server/analysis/index'
import type { LogChannels } from '../../../server/analysis/index'
import { compressorOutletTempK } from '../../../server/analysis/compressor'
import { chargeDewPointC } from '../../../server/analysis/density'
import { detectPulls, FULL_LOAD_RULE } from '../../../server/analysis/pulls'
import { normalisedChargeTempK } from '../../../server/analysis/soak'

const K = 273.15
const fixture = (name: string) => ({ path: fileURLToPath(new URL(`../../fixtures/real/${name}`, import.meta.url)) })

interface PullSpec { startS: number, lengthS: number }
interface Synthetic {
  hz?: number
  durationS?: number
  pulls: PullSpec[]
  pedalTop?: number
  ambientC?: number | ((t: number) => number)
  /** Charge temperature during a pull, °C, by seconds into the pull. */
  chargeInPull?: (s: number, pull: number) => number
  cruiseChargeC?: number
  peakKpa?: number
  cruiseKpa?: number
  speedKmh?: (t: number) => number
  chargeAt?: (t: number, base: number) => number
  preCooler?: boolean
}

/** A log at `hz` samples per second: cruise at 30 % pedal and light boost, pulls at the pedal's top with boost arriving over 1 s. */
function synthetic(spec: Synthetic): LogChannels {
  const hz = spec.hz ?? 10
  const n = Math.round((spec.durationS ?? 600) * hz)
  const timeS = new Float64Array(n)
  const pedal = new Float32Array(n)
  const map = new Float32Array(n)
  const charge = new Float32Array(n)
  const ambient = new Float32Array(n)
  const rpm = new Float32Array(n)
  const speed = new Float32Array(n)
  const pre = new Float32Array(n)
  const top = spec.pedalTop ?? 100
  const peak = (spec.peakKpa ?? 230) * 1000
  const cruise = (spec.cruiseKpa ?? 110) * 1000
  for (let i = 0; i < n; i++) {
    const t = i / hz
    timeS[i] = t
    const amb = typeof spec.ambientC === 'function' ? spec.ambientC(t) : (spec.ambientC ?? 25)
    ambient[i] = amb + K
    rpm[i] = 2500
    speed[i] = (spec.speedKmh ? spec.speedKmh(t) : 80) / 3.6
    const k = spec.pulls.findIndex(p => t >= p.startS && t < p.startS + p.lengthS)
    let c = spec.cruiseChargeC ?? amb + 8
    if (k >= 0) {
      const into = t - spec.pulls[k]!.startS
      pedal[i] = top
      map[i] = cruise + (peak - cruise) * Math.min(1, into)
      c = spec.chargeInPull ? spec.chargeInPull(into, k) : amb + 12 + 2 * into
    }
    else {
      pedal[i] = 0.3 * top
      map[i] = cruise
    }
    charge[i] = (spec.chargeAt ? spec.chargeAt(t, c) : c) + K
    pre[i] = compressorOutletTempK(amb + K, map[i]! / 101_325, 0.7)
  }
  return { timeS, pedalPct: pedal, manifoldPressurePa: map, chargeTempK: charge, ambientTempK: ambient, rpm, speedMps: speed, baroPa: new Float32Array(n).fill(101_325), ...(spec.preCooler ? { preCoolerTempK: pre } : {}) }
}

const SIX_PULLS = [60, 140, 220, 300, 380, 460].map(startS => ({ startS, lengthS: 8 }))

describe('full load found the way the car logs it', () => {
  it('property: whatever top the pedal reports, the pulls are found — by 90 % when it gets there, else by 90 % of its own top with boost near peak', () => {
    fc.assert(fc.property(fc.double({ min: 40, max: 100, noNaN: true }), fc.integer({ min: 1, max: 6 }), (top, count) => {
      const channels = synthetic({ pulls: SIX_PULLS.slice(0, count), pedalTop: top, durationS: 560, hz: 5 })
      const found = detectPulls(channels, { baroPa: 101_325 })
      expect(found.windows).toHaveLength(count)
      expect(found.rule.mode).toBe(top >= FULL_LOAD_RULE.absoluteThresholdPct ? 'threshold' : 'relative')
      if (top < 90) {
        expect(found.rule.corroboration).toBe('boost')
        expect(found.rule.thresholdPct!).toBeCloseTo(0.9 * top, 1)
        expect(found.rule.description).toMatch(/90 % of its highest reading/)
      }
      for (const w of found.windows) expect(w.kind).toBe('sprint')
    }), { numRuns: 60 })
  })

  it('property: cruise below 90 % of the pedal\'s top never makes a pull, whatever the peak boost', () => {
    fc.assert(fc.property(fc.double({ min: 40, max: 89, noNaN: true }), fc.double({ min: 0, max: 0.85, noNaN: true }), fc.integer({ min: 140, max: 300 }), (top, cruiseShare, peakKpa) => {
      const channels = synthetic({ pulls: SIX_PULLS.slice(0, 3), pedalTop: top, peakKpa, durationS: 300, hz: 5 })
      for (let i = 0; i < channels.timeS.length; i++) if (channels.pedalPct![i]! < 0.95 * top) channels.pedalPct![i] = cruiseShare * top
      const found = detectPulls(channels, { baroPa: 101_325 })
      expect(found.windows.map(w => Math.floor(w.startS))).toEqual([60, 140, 220])
    }), { numRuns: 40 })
  })

  it('labels a long stretch at high boost without full pedal as a sustained pull', () => {
    const channels = synthetic({ pulls: [{ startS: 100, lengthS: 6 }], durationS: 400 })
    // A motorway climb: pedal at 60 % of its top for 40 s with boost near peak.
    for (let i = 0; i < channels.timeS.length; i++) {
      const t = channels.timeS[i]!
      if (t >= 200 && t < 240) {
        channels.pedalPct![i] = 60
        channels.manifoldPressurePa![i] = 225_000
      }
    }
    const result = analyseLog(channels)
    expect(result.pulls.map(p => p.kind)).toEqual(['sprint', 'sustained'])
    expect(result.pulls[1]!.durationS).toBeGreaterThan(39)
    expect(result.summary.fullLoadRule.description).toMatch(/sustained pulls: boost ≥ \d+(\.\d)? kPa abs held 8 s/)
  })

  it('lets the user set the rule by hand, and says so', () => {
    const channels = synthetic({ pulls: SIX_PULLS, pedalTop: 70 })
    const byHand = analyseLog(channels, { pullEdits: { rule: { thresholdPct: 65, sustained: false } } })
    expect(byHand.summary.fullLoadRule).toMatchObject({ mode: 'threshold', source: 'by hand', thresholdPct: 65, sustained: null })
    expect(byHand.summary.pullCount).toBe(6)
    const tooHigh = analyseLog(channels, { pullEdits: { rule: { thresholdPct: 90 } } })
    expect(tooHigh.summary.pullCount).toBe(0)
    expect(tooHigh.warnings.find(w => w.code === 'NO_PULLS')!.message).toMatch(/set the rule by hand/i)
  })
})

describe('artefacts that are artefacts, and only those', () => {
  it('keeps every pull of a high-boost build with a fast sensor climbing 15 K/s as boost arrives', () => {
    // Charge air jumps 15 K in the first second of each pull (boost step), then climbs on.
    const channels = synthetic({ pulls: SIX_PULLS, peakKpa: 280, hz: 20, chargeInPull: (s, k) => 33 + k + 15 * Math.min(1, s) + 0.5 * s })
    const result = analyseLog(channels)
    expect(result.masks).toEqual([])
    expect(result.summary.pullCount).toBe(6)
    expect(result.summary.leftOutPulls).toEqual([])
  })

  it('masks single-reading spikes that come straight back, steps at steady load and −40 °C dropouts', () => {
    const channels = synthetic({ pulls: SIX_PULLS, hz: 10 })
    const at = (s: number) => Math.round(s * 10)
    channels.chargeTempK![at(30)] = 33 + 25 + K // one reading 25 K high, then back
    channels.chargeTempK![at(520)] = -40 + K // sensor dropout
    for (let i = at(560); i < at(580); i++) channels.chargeTempK![i] = 33 + 30 + K // a step at steady cruise, and back
    const result = analyseLog(channels)
    const reasons = result.masks.map(m => m.reason)
    expect(reasons).toEqual(expect.arrayContaining(['temp-spike', 'sensor-dropout', 'temp-step']))
    const covers = (s: number) => result.masks.some(m => s >= m.startS - 1e-6 && s <= m.endS + 1e-6)
    expect(covers(30)).toBe(true)
    expect(covers(52)).toBe(false)
    expect(covers(520)).toBe(true)
    expect(covers(560)).toBe(true)
    expect(result.summary.pullCount).toBe(6)
    expect(covers(570)).toBe(true)
    // Nothing from the spike (+33 K over ambient), the step (+38 K) or the dropout reaches the
    // drive summary: its hottest reading is the end of a pull (+28 K).
    expect(result.drive.deltaOverAmbientK!.max).toBeCloseTo(28, 0)
  })

  it('when most pulls are left out, says so first with the reason, and keeps them when asked', () => {
    // A sensor that reads below ambient during the pulls (a fault, or a very cold core).
    const channels = synthetic({ pulls: SIX_PULLS, chargeInPull: () => 15 })
    const result = analyseLog(channels)
    expect(result.summary.pullCount).toBe(0)
    expect(result.summary.foundPullCount).toBe(6)
    expect(result.summary.leftOutPulls).toHaveLength(6)
    expect(result.summary.leftOutPulls[0]!.reasons).toContain('below-ambient')
    expect(result.warnings[0]!.code).toBe('MOST_PULLS_LEFT_OUT')
    expect(result.warnings[0]!.message).toMatch(/^6 of the 6 pulls found were left out \(.*charge temperature read below ambient.*\)\. If you trust the sensor there, keep them\.$/)
    const kept = analyseLog(channels, { pullEdits: { keepLeftOut: true } })
    expect(kept.summary.pullCount).toBe(6)
    expect(kept.pulls.every(p => p.keptDespiteLeftOut)).toBe(true)
  })

  it('flags a manifold pressure pinned at 255 kPa: no density figure from it, and a wider-range sensor is asked for', () => {
    const channels = synthetic({ pulls: SIX_PULLS, peakKpa: 300 })
    for (let i = 0; i < channels.timeS.length; i++) channels.manifoldPressurePa![i] = Math.min(channels.manifoldPressurePa![i]!, 255_000)
    const result = analyseLog(channels)
    expect(result.masks.filter(m => m.reason === 'clipped')).toHaveLength(6)
    expect(result.summary.pullCount).toBe(6)
    for (const pull of result.pulls) {
      expect(pull.clipped).toEqual(['manifoldPressure'])
      expect(pull.densityRatioIsa).toBeNull()
      expect(pull.pressureRatio).toBeNull()
      expect(pull.effectivenessSource).toBeNull()
    }
    expect(result.warnings.find(w => w.code === 'SENSOR_CLIPPED')!.message).toMatch(/wider-range sensor is needed/)
    expect(result.summary.lossNormalisation.method).toBe('ambient')
  })
})

describe('heat soak across the whole drive', () => {
  it('gives the drive summary and a soak event with its recovery time from the drive itself', () => {
    // Cruise at ambient + 8 K; stopped 200–300 s while the charge climbs 12 K; moving again from
    // 300 s, the excess decays with a 30 s time constant: the recovery time is 30 s by definition
    // (63 % of the rise gone: one first-order time constant, Newton's law of cooling).
    const channels = synthetic({
      pulls: [],
      durationS: 600,
      speedKmh: t => (t >= 200 && t < 300 ? 0 : 90),
      chargeAt: (t, base) => base + (t < 200 ? 0 : t < 300 ? 12 * (t - 200) / 100 : 12 * Math.exp(-(t - 300) / 30)),
    })
    const result = analyseLog(channels)
    expect(result.drive.soakEvents).toHaveLength(1)
    const event = result.drive.soakEvents[0]!
    expect(event.startS).toBeCloseTo(200, 0)
    expect(event.endS).toBeCloseTo(299.9, 0)
    expect(event.riseK).toBeCloseTo(12, 0)
    expect(event.recoveryS!).toBeCloseTo(30, -0.5)
    expect(result.drive.runningS).toBeCloseTo(600, -1)
    expect(result.drive.movingS).toBeCloseTo(500, -1)
    expect(result.drive.boostedS).toBe(0)
    expect(result.drive.deltaOverAmbientK!.median).toBeCloseTo(8, 1)
    expect(result.drive.deltaOverAmbientUnderBoostK).toBeNull()
    expect(Object.keys(result.drive).sort()).toEqual(['boostedS', 'deltaOverAmbientK', 'deltaOverAmbientUnderBoostK', 'movingS', 'runningS', 'soakEvents'])
    expect(result.warnings.some(w => w.code === 'SOAK_EVENTS')).toBe(true)
  })
})

describe('honest physics labels', () => {
  it('restates charge temperature at one ambient and pressure ratio (compressor relation, reference sheet §4; effectiveness §5)', () => {
    const eff = 0.72
    // Reference sheet CMP-1: T1 298.15 K, PR 2.2, η 0.72 → T2 402.778 K. A core leaving 20 % of
    // that rise: 298.15 + 0.2·104.628 = 319.0756 K.
    expect(compressorOutletTempK(298.15, 2.2, eff)).toBeCloseTo(402.778, 3)
    const ref = { refAmbientK: 298.15, refPressureRatio: 2.2, efficiency: eff }
    expect(normalisedChargeTempK({ chargeK: 298.15 + 0.2 * 104.628, ambientK: 298.15, pressureRatio: 2.2, ...ref })).toBeCloseTo(319.0756, 3)
    // Same core state (20 % left) on a colder day at lower boost restates to the same temperature.
    const t2 = compressorOutletTempK(283.15, 1.8, eff)
    expect(normalisedChargeTempK({ chargeK: 283.15 + 0.2 * (t2 - 283.15), ambientK: 283.15, pressureRatio: 1.8, ...ref })).toBeCloseTo(319.0756, 2)
    // Without boost only the ambient is swapped.
    expect(normalisedChargeTempK({ chargeK: 300, ambientK: 290, pressureRatio: Number.NaN, ...ref })).toBeCloseTo(308.15, 9)
    expect(() => normalisedChargeTempK({ chargeK: Number.NaN, ambientK: 290, pressureRatio: 2, ...ref })).toThrow(/positive absolute temperature/)
  })

  it('does not call weather heat soak: ambient rising 10 K over the log with a steady core loses nothing against the coolest pull', () => {
    const channels = synthetic({ pulls: SIX_PULLS, ambientC: t => 20 + t / 60, preCooler: true, chargeInPull: (s, k) => 20 + (60 + 80 * k + s) / 60 + 15 })
    const result = analyseLog(channels)
    expect(result.summary.lossNormalisation.method).toBe('ambient-and-boost')
    // The synthetic holds temperature over ambient at 15 K; a steady core holds its share (1 − ε)
    // of the compressor's rise, which grows with ambient (T1 in §4), so ~0.5 K (~0.1 %) is left.
    expect(result.summary.maxPowerLossVsCoolestPct!).toBeLessThan(0.2)
    // Without the restatement the last pull would look ~2.6 % down (density law on 6.7 K at ~313 K).
    const plain = 100 * (1 - (result.pulls[0]!.meanChargeTempC + K) / (result.pulls[5]!.meanChargeTempC + K))
    expect(plain).toBeGreaterThan(2)
  })

  it('reports measured and estimated effectiveness apart, each labelled, and says by how much the estimate reads low', () => {
    const channels = synthetic({ pulls: SIX_PULLS, preCooler: true })
    for (let i = 0; i < channels.timeS.length; i++) if (channels.timeS[i]! > 250) channels.preCoolerTempK![i] = Number.NaN
    const result = analyseLog(channels)
    const s = result.summary
    expect(s.measuredPullCount).toBe(3)
    expect(s.estimatedPullCount).toBe(3)
    const mean = (source: string) => {
      const values = result.pulls.filter(p => p.effectivenessSource === source).map(p => p.effectiveness!)
      return values.reduce((a, b) => a + b, 0) / values.length
    }
    expect(s.meanEffectivenessMeasured!).toBeCloseTo(mean('measured'), 3)
    expect(s.meanEffectivenessEstimated!).toBeCloseTo(mean('estimated'), 3)
    expect(s.meanEffectiveness).toBe(s.meanEffectivenessMeasured)
    expect(s.effectivenessSource).toBe('measured')
    // Reference sheet §13, last bullet (10 kPa drop at 220 kPa: +6–7 K, about +0.01).
    expect(result.warnings.find(w => w.code === 'EFFECTIVENESS_ESTIMATED')!.message).toMatch(/reads low.*6–7 K.*0\.01/)
  })

  it('says baro came from ISA when the importer filled it, and uses a logged humidity for the dew point', async () => {
    const rows = Array.from({ length: 200 }, (_, i) => `${(i * 0.5).toFixed(1)},${i >= 40 && i < 60 ? 100 : 30},${i >= 40 && i < 60 ? 16 : 2},${i >= 40 && i < 60 ? 45 : 38},30,2500,60`)
    const log = await importLog(`Time (s),Pedal (%),Boost (psi),Charge air temp (°C),Ambient temp (°C),Engine speed (rpm),Humidity (%)\n${rows.join('\n')}\n`)
    const result = analyseLog(log)
    expect(result.summary.baroSource).toBe('isa')
    expect(result.summary.humiditySource).toBe('channel')
    const pull = result.pulls[0]!
    // Same inputs through the dew-point function (its own check values are in tests/unit/physics).
    const expected = chargeDewPointC({ ambientPressurePa: 101_325, ambientTempK: 30 + K, relativeHumidity: 0.6, chargePressurePa: pull.meanManifoldKpa! * 1000 })
    expect(pull.chargeDewPointC!).toBeCloseTo(expected, 1)
  })
})

describe('real logs', () => {
  it('finds the diesel motorway pulls by the pedal\'s own range with boost near peak, and a sustained pull', async () => {
    const result = analyseLog(await importLog(fixture('diesel-motorway-boost-excerpt.csv')))
    const rule = result.summary.fullLoadRule
    expect(rule).toMatchObject({ mode: 'relative', channel: 'pedal', corroboration: 'boost', channelMaxPct: 59.6 })
    expect(rule.description).toMatch(/^Accelerator pedal at ≥ 90 % of its highest reading, 59\.6 %/)
    expect(result.summary.pullCount).toBe(2)
    expect(result.pulls.map(p => p.kind)).toEqual(['sustained', 'sprint'])
    expect(result.summary.baroSource).toBe('isa')
    expect(result.summary.meanEffectivenessMeasured).toBeNull()
    expect(result.summary.estimatedPullCount).toBe(2)
    expect(result.drive.boostedS).toBeGreaterThan(600)
    expect(result.drive.deltaOverAmbientUnderBoostK!.median).toBeGreaterThan(3)
  })

  it('finds the petrol pulls by the pedal\'s own range with calculated engine load, and no boost', async () => {
    const log = await importLog(fixture('petrol-pulls-excerpt.csv'))
    expect(log.mapping.engineLoad?.column).toBe('ENGINE_LOAD ()')
    const result = analyseLog(log, { ambientTempC: 30 })
    expect(result.summary.fullLoadRule).toMatchObject({ mode: 'relative', corroboration: 'load' })
    expect(result.summary.pullCount).toBe(2)
    expect(result.drive.deltaOverAmbientUnderBoostK).toBeNull()
    expect(result.summary.lossNormalisation.method).toBe('ambient')
    expect(result.warnings.find(w => w.code === 'NO_BOOST')?.message).toBe('2 pulls show no boost and the log has no pre-cooler temperature, so intercooler effectiveness is not given for them.')
  })

  it('leaves the diesel engine-stop artefacts out, and nothing else', async () => {
    const result = analyseLog(await importLog(fixture('diesel-engine-stop-excerpt.csv')))
    expect(new Set(result.masks.map(m => m.reason))).toEqual(new Set(['engine-off', 'restart-settle', 'temp-step']))
    // Every left-out stretch touches the stop (about 1 373–1 415 s) or the settling after it.
    for (const mask of result.masks) expect(mask.startS < 100 || (mask.endS > 20 && mask.startS < 120)).toBe(true)
  })
})
