// Shapes of the core catalogue and sizing APIs for pages. Types only: nothing from the server
// reaches the client bundle.
import type { cores } from '../../db/schema'
import type { SizingResult } from '../../server/analysis/sizing'

export type CoreRow = typeof cores.$inferSelect
export type CoreView = Omit<CoreRow, 'createdAt' | 'updatedAt' | 'retiredAt'> & {
  createdAt: string
  updatedAt: string | null
  retiredAt: string | null
  retired: boolean
}

export interface CorePage {
  items: CoreView[]
  total: number
  page: number
  pageSize: number
}

export type { SizingCandidate, SizingCalibration, SizingDesign, SizingResult } from '../../server/analysis/sizing'

export interface StoredSizing extends SizingResult {
  id: number
  vehicleId: number
  logId: number | null
  createdAt?: string
}
