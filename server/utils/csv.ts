// CSV written for spreadsheets. A text cell that starts with = + - @ (or a tab or carriage
// return) would be run as a formula by a spreadsheet (OWASP "CSV injection"): prefix it with a
// quote so it shows as text. Numbers are written as numbers and cannot carry a formula.
const FORMULA_START = /^[=+\-@\t\r]/

export function csvCell(value: string | number | null | undefined): string {
  if (value === null || value === undefined) return ''
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : ''
  const text = FORMULA_START.test(value) ? `'${value}` : value
  return /[",\n\r]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text
}

export function csvLine(cells: Array<string | number | null | undefined>): string {
  return cells.map(csvCell).join(',')
}

// Attachment name without path or quote characters; the original name survives in the UTF-8 form.
export function contentDisposition(name: string) {
  const ascii = name.replace(/[^\w.\- ]+/g, '_').slice(0, 120) || 'log.csv'
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name.slice(0, 200))}`
}
