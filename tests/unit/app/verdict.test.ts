import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { analyseLog, importLog } from '../../../server/analysis/index'
import { verdictFor } from '../../../utils/verdict'
import { analysisWith } from '../../fixtures/report'

const NO_SOAK = 'No heat soak to speak of across the pulls: no change needed. Keep this log as the reference for later comparisons.'

/** A core that barely soaks, but whose charge air runs `deltaK` over ambient on each pull. */
function warmButSteady(deltas: number[]) {
  const analysis = analysisWith(0.2, deltas.length)
  analysis.pulls.forEach((p, i) => {
    p.meanDeltaOverAmbientK = deltas[i]!
  })
  analysis.summary.meanDeltaOverAmbientK = deltas.reduce((a, b) => a + b, 0) / deltas.length
  return analysis
}

const diesel = { ratedPowerKw: 110, fuel: 'diesel' }

describe('verdictFor', () => {
  it('calls a core that barely soaks good and says no change is needed', () => {
    const v = verdictFor(analysisWith(0.5), diesel)
    expect(v.level).toBe('good')
    expect(v.headline).toMatch(/holds up well/)
    expect(v.consider).toEqual([NO_SOAK])
  })

  it('tells one story when the core does not soak but runs hot over ambient: no soak, but a larger core would lower that', () => {
    const v = verdictFor(warmButSteady([26, 27, 27.5, 28]), diesel)
    expect(v.level).toBe('good')
    expect(v.consider).toEqual([
      'No heat soak to speak of across the pulls, but the charge air runs 27.1 K above the ambient temperature on every pull: a larger core, or better air flow to it (ducting, no blocked grille), would lower that. More than 25 K over ambient is a lot for a working intercooler (common practice, no source); ask the workshop whether a change would pay off.',
    ])
    expect(v.consider.join(' ')).not.toMatch(/No change needed|no change needed/)
    // Only the average is over the line: it says "on average", in the display unit.
    const f = verdictFor(warmButSteady([20, 30, 31]), diesel, { temperature: 'F', power: 'kW' })
    expect(f.consider[0]).toMatch(/^No heat soak to speak of across the pulls, but the charge air runs 48\.6 °F above the ambient temperature on average: .* More than 45 °F over ambient/)
    // At or under 25 K over ambient there is nothing to add.
    expect(verdictFor(warmButSteady([25, 25]), diesel).consider).toEqual([NO_SOAK])
  })

  it('gives the real petrol excerpt (ambient entered as 31 °C) one consistent piece of advice', async () => {
    const log = await importLog({ path: fileURLToPath(new URL('../../fixtures/real/petrol-pulls-excerpt.csv', import.meta.url)) })
    const v = verdictFor(analyseLog(log, { ambientTempC: 31 }), { ratedPowerKw: 100, fuel: 'petrol' })
    // Two pulls, the second 1.46 K cooler than the first, about 8 K over ambient: no soak, not warm.
    expect(v.level).toBe('good')
    expect(v.summary).toMatch(/^Over two pulls the charge air stayed steady \(−1\.5 K from the first to the last pull\)/)
    expect(v.consider).toEqual([NO_SOAK])
    // The same pulls on a 12 °C day sit about 27 K over ambient: still no soak, and the one suggestion says why a larger core.
    const cool = verdictFor(analyseLog(log, { ambientTempC: 12 }), { ratedPowerKw: 100, fuel: 'petrol' })
    expect(cool.level).toBe('good')
    expect(cool.consider).toEqual([
      'No heat soak to speak of across the pulls, but the charge air runs 27.0 K above the ambient temperature on every pull: a larger core, or better air flow to it (ducting, no blocked grille), would lower that. More than 25 K over ambient is a lot for a working intercooler (common practice, no source); ask the workshop whether a change would pay off.',
    ])
  })

  it('tells the driver how far the charge air climbed and what the hottest run cost', () => {
    const v = verdictFor(analysisWith(1.8), diesel)
    // 40 → 49 °C over six pulls: 1 − 313.15/322.15 = 2.79 %; 2.79 % of 110 kW ≈ 3.1 kW.
    expect(v.level).toBe('fair')
    expect(v.summary).toContain('six pulls')
    expect(v.summary).toContain('9.0 K')
    expect(v.summary).toMatch(/about 2\.8 % \(about 3\.1 kW\) less power than the coolest/)
  })

  it('judges a large climb as heavy soak and suggests a bigger core', () => {
    const v = verdictFor(analysisWith(4), diesel)
    expect(v.level).toBe('poor')
    expect(v.consider.join(' ')).toMatch(/larger intercooler core/)
  })

  it('draws the lines at 1.5 % and 4 % of power lost (our own judgement, common practice, no source)', () => {
    const withLoss = (lossPct: number) => {
      const analysis = analysisWith(1)
      analysis.summary.maxPowerLossVsCoolestPct = lossPct
      return verdictFor(analysis, diesel).level
    }
    expect([1.49, 1.5, 3.99, 4].map(withLoss)).toEqual(['good', 'fair', 'fair', 'poor'])
  })

  it('speaks in the display units: °F differences and horsepower', () => {
    const v = verdictFor(analysisWith(1.8), diesel, { temperature: 'F', power: 'hp' })
    expect(v.summary).toContain('16.2 °F')
    expect(v.summary).toMatch(/4\.1 hp/)
  })

  it('states what the estimate assumes', () => {
    const v = verdictFor(analysisWith(1.8), diesel)
    expect(v.assumptions).toMatch(/air-limited/)
    expect(v.assumptions).toMatch(/same boost/)
  })

  it('warns a petrol engine about knock when it soaks', () => {
    expect(verdictFor(analysisWith(2.5), { ratedPowerKw: 120, fuel: 'petrol' }).consider.join(' ')).toMatch(/knock/)
    expect(verdictFor(analysisWith(2.5), diesel).consider.join(' ')).not.toMatch(/knock/)
  })

  it('does not judge a log without pulls, and says how to record one', () => {
    const v = verdictFor(analysisWith(1, 0), diesel)
    expect(v.level).toBe('unknown')
    expect(v.headline).toMatch(/^No pulls found — here is how the charge air did over the drive/)
    // The drive summary takes the place of the pull figures.
    expect(v.summary).toMatch(/While moving, the charge air sat 9\.0 K above the ambient temperature most of the time \(18\.0 K or less for 95 % of it, 24\.0 K at most\)/)
    expect(v.summary).toMatch(/once the charge air heated up while the car was slow or stopped, by up to 11\.0 K\. Once moving again it took about 45 s to come back down/)
    expect(v.consider[0]).toMatch(/dyno or closed course/)
  })

  it('says first when most pulls were left out, with the reason, and offers to keep them', () => {
    const analysis = analysisWith(1, 1)
    analysis.summary.foundPullCount = 5
    analysis.summary.leftOutPulls = [1, 2, 3, 4].map(k => ({ startS: k * 60, endS: k * 60 + 8, reasons: ['temp-step' as const] }))
    const v = verdictFor(analysis, diesel)
    expect(v.headline).toBe('Most pulls were left out: 4 of the 5 pulls found were left out, because the charge temperature jumped with no change in boost to explain it.')
    expect(v.offerKeepLeftOut).toBe(true)
    expect(v.meaning).toMatch(/If you trust the sensor there, keep those pulls/)
  })

  it('tells the soak events in plain words beside the pull verdict', () => {
    const v = verdictFor(analysisWith(1.8), diesel)
    expect(v.drive).toMatch(/Under boost \(60 s of the drive\) it sat 14\.0 K above/)
    expect(v.drive).toMatch(/Heat soak in traffic: once/)
    expect(v.offerKeepLeftOut).toBe(false)
    expect(v.facts.find(f => f.label === 'Full-load rule')!.value).toBe('Accelerator pedal at ≥ 90.0 % (chosen automatically)')
    expect(v.facts.some(f => /^Effectiveness, measured \(6 pulls\)$/.test(f.label))).toBe(true)
  })

  it('needs more than one pull to speak of soak', () => {
    const v = verdictFor(analysisWith(1, 1), diesel)
    expect(v.level).toBe('unknown')
    expect(v.summary).toMatch(/10\.0 K above the ambient temperature/)
  })

  it('says when the ambient temperature was typed in rather than logged', () => {
    const analysis = analysisWith(1.8)
    analysis.summary.ambientSource = 'entered'
    expect(verdictFor(analysis, diesel).assumptions).toMatch(/entered by hand/)
  })
})
