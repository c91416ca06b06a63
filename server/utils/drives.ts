// Several drives in one uploaded file (issue 10): the `drives` form field names which drives to keep
// ("all", or 0-based indexes such as "1,3"); each chosen drive is analysed first — so a bad drive
// stores nothing — and then stored as its own log that keeps the file and its drive index.
import { copyFile, rm } from 'node:fs/promises'
import type { DriveInfo } from '../analysis'
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
 * Store one analysed log per chosen drive. Every drive is analysed (in the worker pool) before
 * anything is written, so a drive the engine refuses leaves no log behind; then each is stored in
 * turn with its own copy of the streamed file, so each log keeps the file and its drive index.
 */
export async function storeChosenDrives(input: NewLog & { file: { temporaryPath: string, sizeBytes: number, sha256: string } }, choice: string) {
  const path = input.file.temporaryPath
  const drives = await drivesInFile(path, input.mapping, input.conditions)
  const chosen = parseDriveChoice(choice, drives)
  // A file of one drive is stored as the whole file (no drive index), whatever the choice said.
  const indexes: (number | undefined)[] = drives.length === 1 ? [undefined] : chosen
  for (const driveIndex of indexes) await importAndAnalyse({ path }, input.mapping, input.conditions, input.vehicle, undefined, driveIndex)
  const ids: number[] = []
  for (const driveIndex of indexes) {
    const copy = temporaryUploadPath(incomingDir())
    await copyFile(path, copy)
    try {
      const { log } = await storeNewLog({ ...input, file: { ...input.file, temporaryPath: copy }, driveIndex })
      ids.push(log.id)
    }
    finally {
      await rm(copy, { force: true })
    }
  }
  return ids
}
