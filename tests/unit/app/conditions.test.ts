import { describe, expect, it } from 'vitest'
import { conditionInBounds, recordedOnProblem } from '../../../shared/utils/conditions'
import { parseMappingInput } from '../../../server/analysis'

describe('the day of the pulls', () => {
  const now = new Date('2026-12-02T08:00:00Z')
  it.each(['9999-99-99', '2026-02-30', '2026-13-01', '1989-12-31', '2026-12-04', '2026-7-14', ''])('refuses %j', (text) => {
    expect(recordedOnProblem(text, now)).toMatch(/day of the pulls/)
  })
  it.each(['1990-01-01', '2024-02-29', '2026-12-02', '2026-12-03'])('takes %s', (text) => {
    expect(recordedOnProblem(text, now)).toBeNull()
  })
})

describe('one set of bounds for conditions and fixed mapping values', () => {
  it('bounds the barometric pressure to 50–110 kPa', () => {
    expect(conditionInBounds('baroKpa', 101.3)).toBe(true)
    expect(conditionInBounds('baroKpa', 1e308)).toBe(false)
    expect(conditionInBounds('baroKpa', Number.NaN)).toBe(false)
  })

  it('lets the engine\'s mapping parser refuse a fixed value out of bounds, in any unit', () => {
    expect(() => parseMappingInput({ baro: { value: 1e308, unit: 'kPa' } })).toThrow(/50 and 110 kPa/)
    expect(() => parseMappingInput({ baro: { value: 29.9, unit: 'psi' } })).toThrow(/barometric/)
    expect(() => parseMappingInput({ ambientTemp: { value: 150, unit: 'degF' } })).toThrow(/−40 and 60 °C/)
    expect(parseMappingInput({ baro: { value: 14.5, unit: 'psi' } }).baro).toEqual({ column: undefined, unit: 'psi', value: 14.5 })
    expect(parseMappingInput({ ambientTemp: { value: 300, unit: 'K' } }).ambientTemp?.value).toBe(300)
  })
})
