import { describe, expect, it } from 'vitest'
import { compressorOutletTempK } from '../../../server/analysis/compressor'
import { whatIfAmbient } from '../../../server/analysis/whatif'

describe('what-if ambient', () => {
  it('moves a pull to a hotter day by the compressor relation and the measured effectiveness', () => {
    // Hand-worked: pre-cooler 100 °C at 25 °C ambient, ε 0.7 → charge 47.5 °C.
    // At 35 °C: pre-cooler 373.15·308.15/298.15 = 385.6660 K; charge = 385.6660 − 0.7·(385.6660 − 308.15) = 331.4048 K.
    const result = whatIfAmbient([{ index: 0, meanChargeTempC: 47.5, ambientTempC: 25, preCoolerTempC: 100, effectiveness: 0.7 }], 35)
    expect(result.pulls[0]!.chargeTempC).toBeCloseTo(331.4048 - 273.15, 3)
    expect(result.pulls[0]!.method).toBe('effectiveness')
    expect(result.pulls[0]!.deltaOverAmbientK).toBeCloseTo(331.4048 - 308.15, 3)
  })

  it('agrees with the compressor relation: outlet temperature scales with inlet temperature (CMP-1 inputs)', () => {
    // Compressor outlet at PR 2.2, η 0.72 from 25 °C and from 35 °C inlet; with ε = 0 the charge
    // temperature is the outlet temperature, so the what-if must reproduce the relation exactly.
    const at25 = compressorOutletTempK(298.15, 2.2, 0.72) - 273.15
    const at35 = compressorOutletTempK(308.15, 2.2, 0.72) - 273.15
    const result = whatIfAmbient([{ index: 0, meanChargeTempC: at25, ambientTempC: 25, preCoolerTempC: at25, effectiveness: 0 }], 35)
    expect(result.pulls[0]!.chargeTempC).toBeCloseTo(at35, 9)
  })

  it('holds the rise over ambient when the log gives no effectiveness', () => {
    const result = whatIfAmbient([{ index: 3, meanChargeTempC: 50, ambientTempC: 20, preCoolerTempC: null, effectiveness: null }], 35)
    expect(result.pulls[0]).toMatchObject({ index: 3, method: 'delta-held' })
    expect(result.pulls[0]!.chargeTempC).toBeCloseTo(65, 9)
  })

  it('reports the loss against the coolest pull of that day and of the logged day (density law)', () => {
    const pulls = [
      { index: 0, meanChargeTempC: 40, ambientTempC: 30, preCoolerTempC: null, effectiveness: null },
      { index: 1, meanChargeTempC: 50, ambientTempC: 30, preCoolerTempC: null, effectiveness: null },
    ]
    const result = whatIfAmbient(pulls, 30)
    // Same ambient: nothing moves; loss of pull 1 vs pull 0 = 1 − 313.15/323.15 = 3.0945 %.
    expect(result.pulls[1]!.powerLossVsCoolestPct).toBeCloseTo(100 * (1 - 313.15 / 323.15), 9)
    expect(result.pulls[1]!.powerLossVsLoggedCoolestPct).toBeCloseTo(result.pulls[1]!.powerLossVsCoolestPct, 9)
    const hotter = whatIfAmbient(pulls, 40)
    expect(hotter.pulls[0]!.powerLossVsCoolestPct).toBeCloseTo(0, 9)
    expect(hotter.pulls[0]!.powerLossVsLoggedCoolestPct).toBeCloseTo(100 * (1 - 313.15 / 323.15), 9)
    expect(hotter.summary.maxPowerLossVsLoggedCoolestPct).toBeGreaterThan(hotter.summary.maxPowerLossVsCoolestPct!)
  })
})
