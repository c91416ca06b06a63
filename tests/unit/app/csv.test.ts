import { describe, expect, it } from 'vitest'
import { cleanFileName, contentDisposition, csvCell } from '../../../server/utils/csv'

describe('CSV cells', () => {
  it.each([
    ['=1+1', '\'=1+1'], [' =1+1', '\' =1+1'], ['\u00A0\u00A0+A1', '\'\u00A0\u00A0+A1'], ['\uFF1DSUM(A1)', '\'\uFF1DSUM(A1)'], ['\t@x', '\'\t@x'],
  ])('neutralises %j, spaces before the sign too', (text, expected) => {
    expect(csvCell(text)).toBe(expected)
  })

  it('leaves plain text and numbers alone', () => {
    expect(csvCell('felt flat = slow')).toBe('felt flat = slow')
    expect(csvCell(-3.5)).toBe('-3.5')
  })
})

describe('file names', () => {
  it('drops direction overrides, isolates and control characters', () => {
    expect(cleanFileName('pulls\u202Evsc.csv')).toBe('pullsvsc.csv')
    expect(cleanFileName('a\u2066b\u2069\u0007\u0085c.csv')).toBe('abc.csv')
    expect(cleanFileName('\u202E')).toBe('log.csv')
    expect(contentDisposition('pulls\u202Evsc.csv')).not.toMatch(/\u202E|%E2%80%AE/)
  })

  it('keeps letters of any script', () => {
    expect(cleanFileName('Prüfstand Läufe.csv')).toBe('Prüfstand Läufe.csv')
  })
})
