import { KELVIN_OFFSET } from './constants'
import { chargeTempFromEffectiveness } from './effectiveness'
import { powerLossPct } from './power'

// "The same car on a hotter (or cooler) day": re-run each pull at another ambient temperature,
// keeping what the log measured about the car: boost, compressor behaviour and the intercooler's
// effectiveness.
//
// Model (each step named):
// - Compressor outlet temperature scales with inlet temperature at the same pressure ratio and
//   isentropic efficiency: T2 = T1·[1 + (PR^((γ−1)/γ) − 1)/η] (standard ideal-gas compressor
//   relation, e.g. Heywood 1988 ch. 6), so T2' = T2·T1'/T1.
// - The intercooler keeps its effectiveness ε: T_charge' = T2' − ε·(T2' − T_amb') (definition of
//   hot-side effectiveness). A hotter day also warms the core and lowers ε a little; holding ε is
//   therefore optimistic for hot days (stated in `basis`).
// - Without a pre-cooler temperature or ε, the pull keeps its rise over ambient (ΔT held).
// - Power follows charge density at the same manifold pressure (air-limited engine, same boost):
//   the density law P2/P1 = T1/T2 is an upper bound (see power.ts).

export interface WhatIfPullInput {
  index: number
  meanChargeTempC: number
  ambientTempC: number
  preCoolerTempC: number | null
  effectiveness: number | null
}

export interface WhatIfPull {
  index: number
  chargeTempC: number
  deltaOverAmbientK: number
  /** Against the coolest pull of the same (what-if) day. */
  powerLossVsCoolestPct: number
  /** Against the coolest pull the log actually recorded. */
  powerLossVsLoggedCoolestPct: number
  method: 'effectiveness' | 'delta-held'
}

export interface WhatIfResult {
  ambientTempC: number
  basis: string
  pulls: WhatIfPull[]
  summary: {
    peakChargeTempC: number | null
    maxPowerLossVsCoolestPct: number | null
    maxPowerLossVsLoggedCoolestPct: number | null
  }
}

export function whatIfAmbient(pulls: readonly WhatIfPullInput[], ambientTempC: number): WhatIfResult {
  const targetK = ambientTempC + KELVIN_OFFSET
  const predicted = pulls.map((pull) => {
    const ambientK = pull.ambientTempC + KELVIN_OFFSET
    const chargeK = pull.meanChargeTempC + KELVIN_OFFSET
    if (pull.preCoolerTempC !== null && pull.effectiveness !== null && Number.isFinite(pull.effectiveness)) {
      const preK = (pull.preCoolerTempC + KELVIN_OFFSET) * targetK / ambientK
      return { index: pull.index, chargeK: chargeTempFromEffectiveness(preK, targetK, pull.effectiveness), method: 'effectiveness' as const }
    }
    return { index: pull.index, chargeK: chargeK - ambientK + targetK, method: 'delta-held' as const }
  })
  const coolestK = Math.min(...predicted.map(p => p.chargeK))
  const loggedCoolestK = Math.min(...pulls.map(p => p.meanChargeTempC + KELVIN_OFFSET))
  const result = predicted.map(p => ({
    index: p.index,
    chargeTempC: p.chargeK - KELVIN_OFFSET,
    deltaOverAmbientK: p.chargeK - targetK,
    powerLossVsCoolestPct: powerLossPct(coolestK, p.chargeK, 'density'),
    powerLossVsLoggedCoolestPct: powerLossPct(loggedCoolestK, p.chargeK, 'density'),
    method: p.method,
  }))
  const max = (values: number[]) => values.length ? Math.max(...values) : null
  return {
    ambientTempC,
    basis: 'Same boost, same compressor behaviour and the intercooler effectiveness measured in this log; pre-cooler temperature scales with the temperature of the air the turbo draws in. Power follows charge density (air-limited engine): an upper bound. On a hotter day the core itself runs warmer, so real charge temperatures may be a little higher still.',
    pulls: result,
    summary: {
      peakChargeTempC: max(result.map(p => p.chargeTempC)),
      maxPowerLossVsCoolestPct: max(result.map(p => p.powerLossVsCoolestPct)),
      maxPowerLossVsLoggedCoolestPct: max(result.map(p => p.powerLossVsLoggedCoolestPct)),
    },
  }
}
