// Upload limits shared by the upload page (friendly early check) and the API (authoritative check).

export const LOG_UPLOAD_LIMITS = {
  maxBytes: 50 * 1024 * 1024,
  maxRows: 2_000_000,
  /** The start of the file the upload page sends for detection, as bytes. */
  sampleBytes: 512 * 1024,
  extensions: ['.csv', '.txt', '.log'] as const,
}

export type LogExtension = (typeof LOG_UPLOAD_LIMITS.extensions)[number]

function formatMegabytes(bytes: number): string {
  return `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`
}

// Returns a person-readable problem with the file, or null when it may be sent.
export function checkLogFile(name: string, sizeBytes: number): string | null {
  const lower = name.trim().toLowerCase()
  const extensions = LOG_UPLOAD_LIMITS.extensions
  if (!extensions.some(ext => lower.endsWith(ext))) {
    return `"${name}" is not a text log. Export the log from your logger as CSV or text (${extensions.join(', ')}) and try again.`
  }
  if (!Number.isFinite(sizeBytes) || sizeBytes <= 0) {
    return `"${name}" is empty. Check that the logger finished writing the file, then export it again.`
  }
  if (sizeBytes > LOG_UPLOAD_LIMITS.maxBytes) {
    return `"${name}" is ${formatMegabytes(sizeBytes)}; the limit is ${formatMegabytes(LOG_UPLOAD_LIMITS.maxBytes)}. Trim the log to the pulls you want analysed, or log fewer channels, and try again.`
  }
  return null
}
