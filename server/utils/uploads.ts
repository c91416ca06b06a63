import { join } from 'node:path'

// Uploaded files are stored under their log id, never under the name the user gave them.
export function logFilePath(logId: number) {
  return join(uploadsDir(), 'logs', String(logId))
}
