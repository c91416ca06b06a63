// Several drives in one uploaded file (issue 10): the `drives` form field names which drives to keep
// ("all", or 0-based indexes such as "1,3"); each chosen drive is analysed first — so a bad drive
// stores nothing — and then stored as its own log that keeps the file and its drive index.
import { listDrives, type DriveInfo } from '../analysis'
import type { NewLog } from './logs'

/** Parse the `drives` form field against the drives the file holds; a bad choice is a 400 with what to send. */
export function parseDriveChoice(text: string, drives: readonly DriveInfo[]): number[] {
  const value = text.trim().toLowerCase()
  const range = drives.length === 1 ? '0' : `0 to ${drives.length - 1}`
  if (value === 'all') return drives.map(d => d.index)
  const parts = value.split(/[\s,;]+/).filter(Boolean)
  if (parts.length === 0 || parts.some(p => !/^\d+$/.test(p))) {
    badRequest(`The drive choice "${text.slice(0, 40)}" is not understood. Send "all", or the drive numbers separated by commas (this file holds drive ${range}).`)
  }
  const chosen = [...new Set(parts.map(Number))].sort((a, b) => a - b)
  const missing = chosen.filter(i => i >= drives.length)
  if (missing.length) badRequest(`This file holds ${drives.length} drive${drives.length === 1 ? '' : 's'} (numbered ${range}); there is no drive ${missing.join(', ')}. Choose again.`)
  return chosen
}

/**
 * Store one analysed log per chosen drive. Every drive is imported and analysed before anything is
 * written, so a drive the engine refuses leaves no log behind; then each is stored in turn.
 */
export async function storeChosenDrives(input: NewLog, choice: string) {
  let drives: DriveInfo[]
  try {
    drives = await listDrives(input.bytes, { mapping: input.mapping, altitudeM: input.conditions.altitudeM ?? undefined, baroKpa: input.conditions.baroKpa ?? undefined, maxRows: LOG_UPLOAD_LIMITS.maxRows })
  }
  catch (error) {
    asHttpError(error)
  }
  const chosen = parseDriveChoice(choice, drives)
  // A file of one drive is stored as the whole file (no drive index), whatever the choice said.
  const indexes: (number | undefined)[] = drives.length === 1 ? [undefined] : chosen
  for (const driveIndex of indexes) await importAndAnalyse(input.bytes, input.mapping, input.conditions, input.vehicle, undefined, driveIndex)
  const ids: number[] = []
  for (const driveIndex of indexes) {
    const { log } = await storeNewLog({ ...input, driveIndex })
    ids.push(log.id)
  }
  return ids
}
