// Report-facing shapes of the logs API, mirrored from the analysis engine (server/analysis) so pages
// and components never import from server/. Values stay SI (°C, K, kPa, kW, %); display units are
// chosen at the edge by the units store.

export type ChannelId
  = | 'time' | 'rpm' | 'throttle' | 'pedal' | 'manifoldPressure' | 'boost' | 'baro'
    | 'chargeTemp' | 'preCoolerTemp' | 'ambientTemp' | 'speed' | 'massAirFlow' | 'humidity'

export type MappingSource = 'auto' | 'explicit' | 'entered' | 'isa'
export type UnitSource = 'header' | 'values' | 'guessed' | 'explicit'

export interface MappedChannel {
  column?: string
  unit: string
  value?: number
  confidence: number
  source: MappingSource
  unitSource: UnitSource
  altitudeM?: number
}

export type LogMapping = Partial<Record<ChannelId, MappedChannel>>

/** One entry of the mapping JSON sent with an upload or saved in a profile. */
export interface MappingEntryInput {
  column?: string
  unit?: string
  value?: number
}
export type MappingInput = Partial<Record<ChannelId, MappingEntryInput | null>>

export type ColumnKind = 'numeric' | 'numeric-with-unit' | 'clock' | 'datetime' | 'empty' | 'text'

export interface ColumnInfo {
  index: number
  header: string
  name: string
  unitText?: string
  unit?: string
  unitFromValues?: boolean
  kind: ColumnKind
  samples: string[]
  numericShare: number
  emptyShare: number
  median: number
  min: number
  max: number
  medianStep: number
}

export interface DetectedFormat {
  encoding: string
  bom: boolean
  delimiter: ',' | ';' | '\t'
  decimalComma: boolean
  lineEnding: string
  headerLineIndex: number
  trailingDelimiter: boolean
  quoted: boolean
  repairedEncoding: boolean
}

export interface CodedMessage {
  code: string
  message: string
  channel?: string
  column?: string
  line?: number
}

export interface LogProfile {
  id: number
  name: string
  headerSignature?: string
  mapping: MappingInput
  createdAt?: string
}

export interface DetectResponse {
  format: DetectedFormat
  columns: ColumnInfo[]
  rows: string[][]
  mapping: LogMapping
  headerSignature: string
  needsAmbientTemp: boolean
  needsBaro: boolean
  warnings: CodedMessage[]
  profile: LogProfile | null
}

export interface PullEdits {
  add?: { startS: number, endS: number }[]
  remove?: number[]
  adjust?: { index: number, startS?: number, endS?: number }[]
}

export interface LogConditions {
  ambientTempC?: number | null
  altitudeM?: number | null
  baroKpa?: number | null
  humidityPct?: number | null
}

export interface LogVehicle {
  id: number
  description: string
  ratedPowerKw: number | null
  fuel: string
  ownerId: number
}

export interface LogDetail {
  id: number
  vehicleId: number
  vehicle: LogVehicle
  originalName: string
  sizeBytes: number
  rowCount: number
  durationS: number
  conditions: LogConditions
  notes: string
  pullEdits: PullEdits | null
  mapping?: MappingInput
  channels: string[]
  recordedOn?: string | null
  createdAt: string
  uploadedByName: string | null
}

export interface LogListItem {
  id: number
  vehicleId: number
  vehicleDescription: string
  originalName: string
  sizeBytes: number
  rowCount: number
  durationS: number
  createdAt: string
  uploadedByName: string | null
  notes: string
  summary: {
    pullCount: number
    peakChargeTempC: number | null
    maxPowerLossVsCoolestPct: number | null
    soakIndexKPerPull: number | null
    meanEffectiveness: number | null
  }
}

export type PullOrigin = 'auto' | 'added' | 'adjusted'

export interface PullResult {
  index: number
  startS: number
  endS: number
  durationS: number
  origin: PullOrigin
  /** Index among the automatically detected pulls, as pull edits name them (null for an added pull). */
  autoIndex: number | null
  meanChargeTempC: number
  peakChargeTempC: number
  ambientTempC: number
  meanDeltaOverAmbientK: number
  meanManifoldKpa: number | null
  pressureRatio: number | null
  preCoolerTempC: number | null
  effectiveness: number | null
  effectivenessSource: 'measured' | 'estimated' | null
  densityRatioIsa: number | null
  powerLossVsCoolestPct: number
  powerLossVsAmbientPct: number
  powerLossVsCoolestKw: number | null
  powerLossVsAmbientKw: number | null
  meanRpm: number | null
  meanSpeedKmh: number | null
  maskedFraction: number
  chargeDewPointC: number | null
}

export type MaskReason = 'engine-off' | 'restart-settle' | 'temp-spike' | 'below-ambient'

export interface MaskSpan {
  startS: number
  endS: number
  reason: MaskReason
  note: string
}

export interface SoakProjection {
  lossPct: number
  atPullNumber: number | null
  morePulls: number | null
  assumption: string
}

export interface AnalysisSummary {
  pullCount: number
  peakChargeTempC: number | null
  maxPowerLossVsCoolestPct: number | null
  maxPowerLossVsAmbientPct: number | null
  maxPowerLossVsCoolestKw: number | null
  soakIndexKPerPull: number | null
  soakFitR2: number | null
  chargeTempRiseK: number | null
  recoveryTimeConstantS: number | null
  projection: SoakProjection
  meanEffectiveness: number | null
  effectivenessSource: 'measured' | 'estimated' | null
  meanDeltaOverAmbientK: number | null
  ambientTempC: number | null
  ambientSource: 'channel' | 'entered'
  baroKpa: number
  baroSource: 'channel' | 'entered' | 'isa'
  pullChannel: 'pedal' | 'throttle' | null
  pullThresholdPct: number
  maxLoadPct: number | null
  durationS: number
  sampleCount: number
  maskedS: number
  compressorEfficiency: number
  powerLossBasis: string
}

export interface AnalysisResult {
  summary: AnalysisSummary
  pulls: PullResult[]
  masks: MaskSpan[]
  warnings: CodedMessage[]
  mapping: LogMapping
}

export interface Series {
  channel: ChannelId
  unit: string
  t: number[]
  v: (number | null)[]
}

export interface DownsampleResult {
  fromS: number
  toS: number
  sampleCount: number
  method: 'minmax' | 'lttb'
  series: Series[]
}

export interface WhatIfResult {
  ambientTempC: number
  basis: string
  pulls: { index: number, chargeTempC: number, deltaOverAmbientK: number, powerLossVsCoolestPct: number }[]
  summary: { peakChargeTempC: number | null, maxPowerLossVsCoolestPct: number | null }
}

export interface ShareLink {
  id: number
  createdAt: string
  expiresAt: string | null
  revokedAt: string | null
}

export interface SharedReport {
  workshopName: string
  vehicleDescription: string
  log: Omit<LogDetail, 'mapping'>
  analysis: AnalysisResult
}

/** Canonical channels offered in the mapping form, in the order a person thinks of them. */
export const MAPPABLE_CHANNELS: readonly { id: ChannelId, label: string, units: readonly string[], needed?: boolean }[] = [
  { id: 'time', label: 'Time', units: ['s', 'ms', 'clock', 'hms'], needed: true },
  { id: 'chargeTemp', label: 'Charge air temperature (after the intercooler)', units: ['degC', 'degF', 'K'], needed: true },
  { id: 'preCoolerTemp', label: 'Temperature before the intercooler', units: ['degC', 'degF', 'K'] },
  { id: 'ambientTemp', label: 'Outside air temperature', units: ['degC', 'degF', 'K'] },
  { id: 'manifoldPressure', label: 'Manifold pressure (absolute)', units: ['kPa', 'hPa', 'mbar', 'bar', 'psi', 'inHg', 'Pa'] },
  { id: 'boost', label: 'Boost (gauge)', units: ['kPa', 'hPa', 'mbar', 'bar', 'psi', 'inHg', 'Pa'] },
  { id: 'baro', label: 'Barometric pressure', units: ['kPa', 'hPa', 'mbar', 'bar', 'psi', 'inHg', 'Pa'] },
  { id: 'rpm', label: 'Engine speed', units: ['rpm'] },
  { id: 'pedal', label: 'Accelerator pedal', units: ['%'] },
  { id: 'throttle', label: 'Throttle', units: ['%'] },
  { id: 'speed', label: 'Road speed', units: ['km/h', 'mph', 'm/s'] },
  { id: 'massAirFlow', label: 'Air mass flow', units: ['g/s', 'kg/h', 'lb/min', 'kg/s'] },
  { id: 'humidity', label: 'Relative humidity', units: ['%'] },
]

/** How a unit code reads on screen. */
export const UNIT_LABELS: Record<string, string> = {
  degC: '°C', degF: '°F', K: 'K', s: 'seconds', ms: 'milliseconds', clock: 'time of day', hms: 'h:mm:ss elapsed',
}
