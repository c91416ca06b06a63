// CSV written for spreadsheets. A text cell that starts with = + - @ (or a tab or carriage
// return) would be run as a formula by a spreadsheet (OWASP "CSV injection"): prefix it with a
// quote so it shows as text. Spreadsheets skip leading spaces before the formula sign, so
// " =1+1" counts too, as do the full-width signs. Numbers are written as numbers and cannot carry a formula.
const FORMULA_START = /^[\t\r]|^[\s\u00A0\u3000]*[=+\-@\uFF1D\uFF0B\uFF0D\uFF20]/

export function csvCell(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return ''
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : ''
  const text = FORMULA_START.test(value) ? `'${value}` : value
  return /[",\n\r]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text
}

export function csvLine(cells: Array<string | number | null | undefined>): string {
  return cells.map(csvCell).join(',')
}

// Control characters and the direction marks, embeddings, overrides and isolates of Unicode's
// bidirectional algorithm: a right-to-left override makes "logs\u202Evsc.exe" read as "logsexe.csv".
// eslint-disable-next-line no-control-regex
const UNSAFE_NAME_CHARACTERS = /[\u0000-\u001F\u007F-\u009F\u061C\u200E\u200F\u202A-\u202E\u2066-\u2069\uFEFF]/g

/** A file name as a person gave it, without characters that hide or disguise what it is. */
export function cleanFileName(name: string, fallback = 'log.csv'): string {
  return name.replace(UNSAFE_NAME_CHARACTERS, '').trim().slice(0, 200) || fallback
}

// Attachment name without path or quote characters; the original name survives in the UTF-8 form.
export function contentDisposition(name: string) {
  const clean = cleanFileName(name)
  const ascii = clean.replace(/[^\w.\- ]+/g, '_').slice(0, 120) || 'log.csv'
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(clean)}`
}
