// Shapes of the comparison, dyno and evidence APIs for pages and components. The engine's result is
// typed once in server/analysis and re-exported here as types only.
import type { BeforeAfterResult, DynoComparison, DynoCorrection, Spread } from '../../server/analysis'

export type { BeforeAfterResult, ComparedPull, SideSummary, UnmatchedPull, VerdictTone, DynoComparison, DynoCorrection, DynoStandard, Spread } from '../../server/analysis'

export interface ComparisonLogMeta {
  id: number
  side: 'before' | 'after'
  label: string
  recordedOn: string | null
  coreName: string | null
}

/** GET /api/comparisons/:id */
export interface ComparisonDetail extends BeforeAfterResult {
  id: number
  vehicleId: number
  vehicle: { id: number, description: string, registration: string, ratedPowerKw: number | null }
  title: string
  logs: ComparisonLogMeta[]
  computedAt: string
  staleAt: string | null
  stale: boolean
  createdAt: string
}

type SharedSide = Omit<BeforeAfterResult['before'], 'logIds'>

/** GET /api/shared/:token for a shared comparison: what the page shows, no internal ids. */
export interface SharedComparison extends Omit<BeforeAfterResult, 'before' | 'after' | 'pulls' | 'unmatchedPulls'> {
  kind: 'comparison'
  workshopName: string
  vehicleDescription: string
  title: string
  computedAt: string
  logs: Omit<ComparisonLogMeta, 'id'>[]
  before: SharedSide
  after: SharedSide
  pulls: Array<Omit<BeforeAfterResult['pulls'][number], 'logId'> & { log: string }>
  unmatchedPulls: Array<Omit<BeforeAfterResult['unmatchedPulls'][number], 'logId'>>
}

/** What the comparison page and the shared page both draw. */
export type ComparisonView = Omit<SharedComparison, 'kind' | 'workshopName' | 'vehicleDescription' | 'computedAt' | 'pulls' | 'unmatchedPulls'> & {
  /** `log`: the log's label ("of 14 Jul"), so pulls of two logs on one side can be told apart. */
  pulls: Array<Omit<BeforeAfterResult['pulls'][number], 'logId'> & { log?: string }>
  unmatchedPulls: Array<Omit<BeforeAfterResult['unmatchedPulls'][number], 'logId'>>
}

export interface ComparisonListItem {
  id: number
  vehicleId: number
  vehicleDescription: string
  title: string
  referenceAmbientC: number
  computedAt: string
  staleAt: string | null
  createdAt: string
  beforeLogCount: number
  afterLogCount: number
  effectivenessGain: number
  chargeTempAtReferenceChangeK: number | null
  verdictTone: BeforeAfterResult['verdictTone']
  verdict: string
}

export interface DynoRun {
  id: number
  vehicleId: number
  label: string
  side: 'before' | 'after' | null
  coreId: number | null
  coreName: string | null
  powerKw: number
  torqueNm: number | null
  rpm: number | null
  ambientTempC: number
  baroKpa: number
  humidityPct: number | null
  runOn: string | null
  createdAt: string
  corrections: Array<Pick<DynoCorrection, 'standard' | 'name' | 'factor' | 'correctedPowerKw' | 'valid' | 'notes'>>
}

export interface DynoComparisonReply {
  standard: DynoCorrection['standard']
  caution: string
  comparison: DynoComparison | null
}

export interface CoreEvidence {
  coreId: number
  core: { id: number, name: string, kind: string, faceWidthMm: number, faceHeightMm: number, depthMm: number, retired: boolean }
  logCount: number
  pullCount: number
  measuredPullCount: number
  estimatedPullCount: number
  effectiveness: Spread
  deltaOverAmbientK: Spread
  vehicles: Array<{ id: number, description: string, registration: string, logCount: number, pullCount: number, medianEffectiveness: number | null }>
}

/** How each correction standard is named on screen. */
export const STANDARD_LABELS: Record<DynoCorrection['standard'], string> = {
  'sae-j1349-2004': 'SAE J1349 (2004)',
  'sae-j1349-1990': 'SAE J1349 (1990)',
  'iso-1585': 'ISO 1585',
  'din-70020': 'DIN 70020',
}

/** GET /api/vehicles/:id/log-choices */
export interface LogChoice {
  id: number
  label: string
  originalName: string
  recordedOn: string | null
  createdAt: string
  coreId: number | null
  coreName: string | null
  ambientTempC: number | null
  pullCount: number
  meanEffectiveness: number | null
  effectivenessSource: 'measured' | 'estimated' | null
}
