// One error type for everything that can go wrong between a file and an analysis, so routes and
// the command line need a single `instanceof` check. The message is written for the person who
// uploaded the file: what was wrong, where (column, line), what was expected and what to do.

export const LOG_IMPORT_ERROR_CODES = [
  'FILE_UNREADABLE',
  'EMPTY_FILE',
  'NOT_TEXT',
  'HEADER_ONLY',
  'NO_COLUMNS',
  'NO_TIME_COLUMN',
  'BAD_TIME_VALUE',
  'NO_TEMPERATURE_COLUMN',
  'UNKNOWN_COLUMN',
  'BAD_UNIT',
  'BAD_MAPPING',
  'TOO_MANY_ROWS',
  'NO_USABLE_ROWS',
  'AMBIENT_REQUIRED',
  'BAD_OPTION',
  'BAD_PULL_EDIT',
  'SEVERAL_DRIVES',
  'BAD_DRIVE',
  'IMPOSSIBLE_INPUT',
] as const

export type LogImportErrorCode = typeof LOG_IMPORT_ERROR_CODES[number]

export interface LogImportErrorDetails {
  /** Header name of the column concerned, as written in the file. */
  column?: string
  /** 1-based line number in the file (the header is line 1). */
  line?: number
  /** Canonical channel concerned (e.g. `chargeTemp`). */
  channel?: string
  /** SEVERAL_DRIVES: the drives found in the file, for the user to choose from. */
  drives?: { index: number, startS: number, durationS: number, rows: number, contains?: string }[]
}

export class LogImportError extends Error {
  override readonly name = 'LogImportError'
  readonly code: LogImportErrorCode
  readonly column?: string
  readonly line?: number
  readonly channel?: string
  readonly drives?: LogImportErrorDetails['drives']

  constructor(code: LogImportErrorCode, message: string, details: LogImportErrorDetails = {}) {
    super(message)
    this.code = code
    this.column = details.column
    this.line = details.line
    this.channel = details.channel
    this.drives = details.drives
  }

  /** Plain object for JSON responses (`{ message }` plus machine-readable context). */
  toJSON(): { code: LogImportErrorCode, message: string } & LogImportErrorDetails {
    return { code: this.code, message: this.message, column: this.column, line: this.line, channel: this.channel, ...(this.drives ? { drives: this.drives } : {}) }
  }
}

export function isLogImportError(error: unknown): error is LogImportError {
  return error instanceof LogImportError
}
