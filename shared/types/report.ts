// Shapes of the logs API for pages and components. What the analysis engine returns is typed
// once, in the engine (server/analysis), and re-exported here as types only: nothing from the
// server reaches the client bundle, and the client cannot drift from the engine's JSON.
// Values stay SI (°C, K, kPa, kW, %); display units are chosen at the edge by the units store.

import type { AnalysisResult, ColumnPreview, MappingInput } from '../../server/analysis'

export type {
  AnalysisResult,
  AnalysisSummary,
  AnalysisWarning,
  ChannelId,
  ColumnInfo,
  DetectedFormat,
  DownsampleResult,
  DriveDetail,
  DriveInfo,
  DriveSummary,
  FullLoadRule,
  LogMapping,
  ManualPullRule,
  MappedChannel,
  MappingEntryInput,
  MappingInput,
  MaskReason,
  MaskSpan,
  PullEdits,
  PullKind,
  PullOrigin,
  PullResult,
  Series,
  SoakEvent,
  SoakProjection,
} from '../../server/analysis'
export type { ColumnKind } from '../../server/analysis/import/detect'
export type { MappingSource, UnitSource } from '../../server/analysis/import/mapping'
export type { WhatIfResult } from '../../server/analysis/whatif'

export interface LogProfile {
  id: number
  name: string
  headerSignature?: string
  mapping: MappingInput
  createdAt?: string
}

/** POST /api/logs/detect: the engine's preview of the file, plus a saved profile for the same header. */
export type DetectResponse = ColumnPreview & { profile: LogProfile | null }

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

export interface ShareLink {
  id: number
  createdAt: string
  expiresAt: string | null
  revokedAt: string | null
}

/** GET /api/shared/:token: only what the shared page shows (no ids, file details or staff notes). */
export interface SharedReport {
  kind: 'log'
  workshopName: string
  vehicleDescription: string
  log: { notes: string, createdAt: string, recordedOn?: string | null } & { vehicle: Pick<LogVehicle, 'ratedPowerKw' | 'fuel'> }
  analysis: AnalysisResult
}
