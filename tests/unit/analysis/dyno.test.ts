import { describe, expect, it } from 'vitest'
import { compareDynoRuns, correctDynoRun, type DynoSideInput } from '../../../server/analysis/dyno'
import { percentile, spreadOf } from '../../../server/analysis/spread'
import { din70020, saeJ1349_2004 } from '../../../server/analysis/correction'

describe('correcting a dyno run', () => {
  const run = { powerKw: 105, rpm: 4000, ambientTempC: 33, baroKpa: 99.8, humidityPct: 40 }

  it('gives the four standards in order, each factor as the engine computes it', () => {
    const corrections = correctDynoRun(run, { fuel: 'diesel', displacementL: 2 })
    expect(corrections.map(c => c.standard)).toEqual(['sae-j1349-2004', 'sae-j1349-1990', 'iso-1585', 'din-70020'])
    const air = { baroPa: 99_800, intakeTempK: 306.15, relativeHumidity: 0.4, observedKw: 105 }
    expect(corrections[0]!.factor).toBe(saeJ1349_2004(air).factor)
    expect(corrections[3]!.factor).toBe(din70020(air).factor)
    for (const c of corrections) expect(c.correctedPowerKw).toBeCloseTo(105 * c.factor!, 10)
  })

  it('uses compression ignition for a diesel and says the fuel flow was estimated', () => {
    const iso = correctDynoRun(run, { fuel: 'diesel', displacementL: 2 })[2]!
    expect(iso.name).toMatch(/compression ignition/)
    expect(iso.notes[0]).toMatch(/estimated from the power at 215 g\/kWh/)
  })

  it('uses spark ignition for petrol, and no ISO figure for a diesel run without rpm', () => {
    expect(correctDynoRun(run, { fuel: 'petrol', displacementL: 2 })[2]!.name).toMatch(/spark ignition/)
    expect(correctDynoRun({ ...run, rpm: null }, { fuel: 'diesel', displacementL: 2 })[2]).toMatchObject({ factor: null, correctedPowerKw: null, valid: false })
  })
})

describe('before and after corrected power', () => {
  it('one run a side: the change, no interval, and the run-to-run note', () => {
    const c = compareDynoRuns([{ side: 'before', correctedPowerKw: 100 }, { side: 'after', correctedPowerKw: 106 }], 'sae-j1349-2004')!
    expect(c.changeKw).toBeCloseTo(6, 12)
    expect(c.changePct).toBeCloseTo(6, 12)
    expect(c.interval).toBeNull()
    expect(c.verdictTone).toBe('too-few')
    expect(c.verdict).toMatch(/one dyno run a side/)
  })

  it('a 2 % change over three runs a side is within the noise', () => {
    const runs: DynoSideInput[] = [
      ...[100, 102, 98].map(p => ({ side: 'before' as const, correctedPowerKw: p })),
      ...[102, 104, 100].map(p => ({ side: 'after' as const, correctedPowerKw: p })),
    ]
    const c = compareDynoRuns(runs, 'din-70020')!
    // Welch: s = 2 each side, SE = √(4/3 + 4/3) = 1.63299, ν = 4, t(0.975, 4) = 2.776445 → ±4.5339
    expect(c.interval![0]).toBeCloseTo(2 - 4.5339, 3)
    expect(c.verdictTone).toBe('noise')
    // The lower end is negative: printed with the typographic minus, as every figure on screen.
    expect(c.verdict).toBe('Corrected power changed by +2.0 kW (+2.0 %), within the noise: the 95 % interval is −2.5 to 6.5 kW, and 2–3 % is within a dyno\'s run-to-run spread.')
  })

  it('needs a run on each side', () => {
    expect(compareDynoRuns([{ side: 'before', correctedPowerKw: 100 }], 'iso-1585')).toBeNull()
  })
})

describe('median and spread', () => {
  it('linear-interpolation percentile: the 40th percentile of 15, 20, 35, 40, 50 is 29 (Hyndman & Fan type 7, as Excel PERCENTILE.INC)', () => {
    expect(percentile([50, 15, 40, 20, 35], 0.4)).toBeCloseTo(29, 12)
    expect(spreadOf([15, 20, 35, 40, 50])).toEqual({ median: 35, p10: 17, p90: 46 })
    expect(spreadOf([])).toEqual({ median: null, p10: null, p90: null })
  })
})
