import { describe, expect, it } from 'vitest'
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

  it('moves the compressor outlet temperature with the inlet temperature (reference sheet §4, CMP-1)', () => {
    // With ε = 0 the charge temperature is the compressor outlet temperature, so the what-if must
    // reproduce the compressor relation T2 = T1·[1 + (PR^0.2857 − 1)/η] at a new inlet temperature.
    // Input: the sheet's worked value (COMPUTED, §4 table): T1 298.15 K, PR 2.2, η 0.72 → T2 402.778 K.
    // Worked by hand at T1 = 308.15 K, same PR and η: PR^0.2857 = 1.2526653;
    // T2 = 308.15 · (1 + 0.2526653/0.72) = 308.15 · 1.3509240 = 416.2872 K → 143.137 °C.
    const result = whatIfAmbient([{ index: 0, meanChargeTempC: 402.778 - 273.15, ambientTempC: 25, preCoolerTempC: 402.778 - 273.15, effectiveness: 0 }], 35)
    expect(result.pulls[0]!.chargeTempC).toBeCloseTo(143.137, 3)
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
