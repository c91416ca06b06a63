// Invented demo logs for the seed, the docs and the tests. Our own scenarios and column names.
// A small plant model, deterministic for a given seed:
// - compressor outlet from the ideal-gas relation with η = 0.70 (reference sheet §4);
// - intercooler: T_charge = T_pre − ε·(T_pre − T_core), where the core's cold side warms while
//   the engine pushes heat into it and relaxes towards ambient between pulls (first-order lag;
//   common practice, no source) — the heat soak the analysis is meant to find;
// - sensor lag on every temperature (first-order, 1–2 s) and measurement noise;
// - air mass flow by speed-density, ṁ = η_v·ρ·V_d·N/120 (Heywood 1988 §2.10, section from memory).
import { compressorOutletTempK } from './compressor'
import { KELVIN_OFFSET, R_DRY_AIR } from './constants'

export const DEMO_SCENARIOS = ['stock-core-hot-day', 'front-mount-after'] as const
export type DemoScenario = typeof DEMO_SCENARIOS[number]

interface ScenarioParams {
  description: string
  ambientC: number
  /** Intercooler effectiveness with a cold core. */
  effectiveness: number
  /** How fast the core's cold side follows the hot charge during a pull, 1/s. */
  soakRatePerS: number
  /** Recovery time constant of the core between pulls, s. */
  recoveryS: number
  /** Peak manifold pressure (absolute), kPa. */
  peakMapKpa: number
  /** Seconds of cruising between pulls. */
  gapS: number
}

const SCENARIOS: Record<DemoScenario, ScenarioParams> = {
  'stock-core-hot-day': {
    description: '2.0 L four-cylinder turbo-diesel hatchback, small stock intercooler, 31 °C day: six full-load pulls with short cruises between them; the core soaks and charge air climbs about 9 K.',
    ambientC: 31,
    effectiveness: 0.62,
    soakRatePerS: 0.011,
    recoveryS: 240,
    peakMapKpa: 225,
    gapS: 35,
  },
  'front-mount-after': {
    description: 'The same car after a larger front-mount intercooler, another day at a similar ambient (30 °C): the same six pulls.',
    ambientC: 30,
    effectiveness: 0.84,
    soakRatePerS: 0.006,
    recoveryS: 90,
    peakMapKpa: 225,
    gapS: 35,
  },
}

export const DEMO_COLUMNS = [
  'Time (s)',
  'Engine speed (rpm)',
  'Pedal (%)',
  'Throttle (%)',
  'Manifold pressure abs (kPa)',
  'Charge air temp (°C)',
  'Pre-cooler temp (°C)',
  'Ambient temp (°C)',
  'Road speed (km/h)',
  'Air mass flow (g/s)',
] as const

export interface DemoLogOptions {
  seed?: number
  /** Ambient temperature of the day, °C (default: the scenario's). */
  ambientC?: number
  sampleRateHz?: number
  pulls?: number
}

export interface DemoLog {
  scenario: DemoScenario
  description: string
  fileName: string
  csv: string
  rowCount: number
  ambientTempC: number
  pullCount: number
}

/** mulberry32: a tiny, well-mixed 32-bit PRNG (public domain, T. Ettinger) — enough for noise. */
function random(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6D2B79F5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

function gaussian(next: () => number): () => number {
  // Box–Muller transform.
  return () => {
    const u = Math.max(next(), 1e-12)
    const v = next()
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v)
  }
}

const DISPLACEMENT_M3 = 0.002
const VOLUMETRIC_EFFICIENCY = 0.9
const PULL_S = 7
const LIFT_S = 3
const WARMUP_S = 60
const COOLDOWN_S = 60

/** Generate a demo log as CSV text. Same scenario and seed → identical bytes. */
export function generateDemoLog(scenario: DemoScenario, options: DemoLogOptions = {}): DemoLog {
  const p = SCENARIOS[scenario]
  if (!p) throw new RangeError(`Unknown demo scenario "${String(scenario)}"; use one of ${DEMO_SCENARIOS.join(', ')}`)
  const rate = options.sampleRateHz ?? 10
  const pulls = options.pulls ?? 6
  const next = random(options.seed ?? (scenario === 'stock-core-hot-day' ? 1 : 2))
  const noise = gaussian(next)
  const dt = 1 / rate
  const cycleS = PULL_S + LIFT_S + p.gapS
  const totalS = WARMUP_S + pulls * cycleS + COOLDOWN_S
  const rows = Math.round(totalS * rate)
  const ambientC = options.ambientC ?? p.ambientC
  const ambientK0 = ambientC + KELVIN_OFFSET
  const baroPa = 100500

  let soakK = 1.5
  let preLagK = ambientK0 + 8
  let chargeLagK = ambientK0 + 6
  let mapKpa = 105
  let rpm = 2000
  const lines: string[] = [DEMO_COLUMNS.join(',')]
  for (let i = 0; i < rows; i++) {
    const t = i * dt
    const ambientK = ambientK0 + 0.3 * t / totalS
    const phaseT = t - WARMUP_S
    const cycle = Math.floor(phaseT / cycleS)
    const inCycle = phaseT - cycle * cycleS
    const inSession = phaseT >= 0 && cycle < pulls
    let pedal: number
    let targetRpm: number
    let targetMap: number
    const pulling = inSession && inCycle < PULL_S
    if (pulling) {
      pedal = inCycle < 0.3 ? 25 + 75 * inCycle / 0.3 : 100
      targetRpm = 1800 + 2450 * inCycle / PULL_S
      targetMap = p.peakMapKpa - 15 * inCycle / PULL_S
    }
    else if (inSession && inCycle < PULL_S + LIFT_S) {
      pedal = 0
      targetRpm = 2200
      targetMap = 95
    }
    else {
      pedal = 22 + 4 * Math.sin(t / 7)
      targetRpm = 2000 + 150 * Math.sin(t / 11)
      targetMap = 112 + 6 * Math.sin(t / 9)
    }
    // Turbo spool and rpm follow their targets with short lags.
    mapKpa += (targetMap - mapKpa) * Math.min(1, dt / (pulling ? 0.6 : 1.2))
    rpm += (targetRpm - rpm) * Math.min(1, dt / (pulling ? 0.1 : 1.5))
    const pr = mapKpa * 1000 / baroPa
    const preK = pr > 1 ? compressorOutletTempK(ambientK, pr, 0.7) : ambientK + 5
    preLagK += (preK - preLagK) * (dt / 1.5)
    // Core cold side: heated by the charge during load, relaxing to ambient otherwise.
    const heatIn = pulling ? p.soakRatePerS * (preLagK - ambientK - soakK) : 0
    soakK += (heatIn - soakK / p.recoveryS) * dt
    const chargeK = preLagK - p.effectiveness * (preLagK - (ambientK + soakK))
    // Core metal and sensor together lag the charge by about 3 s (common practice, no source).
    chargeLagK += (chargeK - chargeLagK) * (dt / 3)
    const speedKmh = rpm * 0.028
    const densityKgM3 = mapKpa * 1000 / (R_DRY_AIR * chargeLagK)
    const mafGs = 1000 * VOLUMETRIC_EFFICIENCY * densityKgM3 * DISPLACEMENT_M3 * rpm / 120
    const throttle = pulling ? 88 : 83
    lines.push([
      t.toFixed(2),
      Math.round(rpm + 8 * noise()),
      clamp(pedal + 0.2 * noise(), 0, 100).toFixed(1),
      clamp(throttle + 0.3 * noise(), 0, 100).toFixed(1),
      (mapKpa + 0.4 * noise()).toFixed(1),
      (chargeLagK - KELVIN_OFFSET + 0.15 * noise()).toFixed(1),
      (preLagK - KELVIN_OFFSET + 0.3 * noise()).toFixed(1),
      (ambientK - KELVIN_OFFSET + 0.1 * noise()).toFixed(1),
      Math.max(0, speedKmh + 0.3 * noise()).toFixed(1),
      Math.max(0, mafGs + 0.8 * noise()).toFixed(1),
    ].join(','))
  }
  return {
    scenario,
    description: p.description,
    fileName: `demo-${scenario}.csv`,
    csv: `${lines.join('\n')}\n`,
    rowCount: rows,
    ambientTempC: ambientC,
    pullCount: pulls,
  }
}

function clamp(value: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, value))
}
