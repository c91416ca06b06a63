// The sizing model against the workshop's own demo evidence (issue 9): calibrated on the demo car's
// factory-core log, does it predict what the demo's after-log measured with the front-mount?
//
// What this check is and is not. The demo logs are invented (server/analysis/demo.ts): each core's
// effectiveness there is a number picked by hand as plausible, not the result of physics. So the
// check cannot prove the model right; it proves the product tells one story — the sizing page does
// not promise a figure that the same workshop's before/after comparison then contradicts. The
// figures compared are the ones a fabricator sees: the sizing's predicted effectiveness for the
// front-mount, and the mean measured effectiveness over the after-log's pulls.
//
// Tolerance ±0.05 of effectiveness, because:
// - the after-log's own six pulls spread from about 0.85 to 0.89 as the core soaks, ±0.02 about
//   their mean, and the sizing predicts one steady figure;
// - each pull's effectiveness comes from three temperatures; ±1 K on each over the ~87 K between
//   ambient and pre-cooler temperature is about ±0.02 of effectiveness (common practice, no source
//   for the ±1 K);
// - 0.05 of effectiveness is about 4 K of charge temperature at these conditions, less than the
//   difference between the cores a fabricator chooses between, and 1–2 % of power.
import { describe, expect, it } from 'vitest'
import { analyseLog, generateDemoLog, importLog, type AnalysisResult } from '../../../server/analysis/index'
import { ROAD_EFFECTIVENESS_CEILING, sizeCores, type SizingCore, type SizingInput } from '../../../server/analysis/sizing'

const TOLERANCE = 0.05

// As the demo seed stores them (server/utils/demo-seed.ts): the factory core's log on a 14 °C day,
// the front-mount's on a 32 °C day, and the two cores' catalogue sizes.
const factoryCore: SizingCore = { id: 1, name: 'Factory side-mount core (small)', faceWidthMm: 300, faceHeightMm: 180, depthMm: 60 }
const frontMount: SizingCore = { id: 2, name: 'Kestrel bar-and-plate front-mount 600', faceWidthMm: 600, faceHeightMm: 300, depthMm: 76 }

async function demoLog(scenario: 'stock-core-hot-day' | 'front-mount-after', ambientC: number) {
  const log = await importLog(generateDemoLog(scenario, { ambientC }).csv)
  const analysis = analyseLog(log, { ratedPowerKw: 110 })
  // Mean air-flow reading inside the pulls, as runSizing (server/utils/sizing.ts) takes it.
  const maf = log.channels.massAirFlowKgPerS!
  const time = log.channels.timeS
  let sum = 0
  let count = 0
  for (const pull of analysis.pulls) {
    for (let i = 0; i < time.length; i++) {
      if (time[i]! >= pull.startS && time[i]! <= pull.endS && Number.isFinite(maf[i]!)) {
        sum += maf[i]!
        count++
      }
    }
  }
  return { analysis, massAirFlowKgS: sum / count }
}

const mean = (values: number[]) => values.reduce((a, b) => a + b, 0) / values.length
const measured = (analysis: AnalysisResult) => mean(analysis.pulls.map(p => p.effectiveness!))

describe('sizing against the demo car\'s own before and after logs', async () => {
  const before = await demoLog('stock-core-hot-day', 14)
  const after = await demoLog('front-mount-after', 32)
  // Design conditions: the after-log's own, so both figures are taken at the same point.
  const design = {
    ambientC: mean(after.analysis.pulls.map(p => p.ambientTempC)),
    boostKpaAbs: mean(after.analysis.pulls.map(p => p.meanManifoldKpa!)),
    roadSpeedKmh: mean(after.analysis.pulls.map(p => p.meanSpeedKmh!)),
  }
  const sizing = (options?: SizingInput['options']) => sizeCores({
    engine: { displacementL: 2.0, fuel: 'diesel' },
    log: { pulls: before.analysis.pulls, baroKpa: before.analysis.summary.baroKpa, massAirFlowKgS: before.massAirFlowKgS },
    fittedCore: factoryCore,
    candidates: [frontMount],
    design,
    options,
  })

  it('uses measured figures on both sides (pre-cooler sensor in both logs)', () => {
    expect(before.analysis.pulls.every(p => p.effectivenessSource === 'measured')).toBe(true)
    expect(after.analysis.pulls.every(p => p.effectivenessSource === 'measured')).toBe(true)
    expect(after.analysis.pulls.length).toBeGreaterThanOrEqual(3)
  })

  it(`predicts the front-mount within ${TOLERANCE} of what the after-log measured`, () => {
    const predicted = sizing().candidates[0]!.predictedEffectiveness
    const observed = measured(after.analysis)
    expect(Math.abs(predicted - observed)).toBeLessThanOrEqual(TOLERANCE)
    // And the prediction stays at or under the road ceiling.
    expect(predicted).toBeLessThanOrEqual(ROAD_EFFECTIVENESS_CEILING)
  })

  it('would miss by more than that with the ideal core alone (why the road ceiling is there)', () => {
    const ideal = sizing({ effectivenessCeiling: 1 }).candidates[0]!.predictedEffectiveness
    expect(ideal - measured(after.analysis)).toBeGreaterThan(TOLERANCE)
  })

  it('barely depends on the share of road speed through the core (not the cause of the optimism)', () => {
    const shares = [0.1, 0.25, 0.4].map(coreAirSpeedRatio => sizing({ effectivenessCeiling: 1, coreAirSpeedRatio }).candidates[0]!.predictedEffectiveness)
    expect(Math.max(...shares) - Math.min(...shares)).toBeLessThan(0.02)
  })
})
