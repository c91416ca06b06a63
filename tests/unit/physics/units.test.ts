import { unit } from 'mathjs'
import { describe, expect, it } from 'vitest'
import {
  conversionFor,
  convert,
  fromSI,
  HP_W,
  INHG_PA,
  isUnit,
  LB_MIN_KG_S,
  parseUnit,
  PS_W,
  PSI_PA,
  quantityOf,
  temperatureDifferenceToK,
  toSI,
  toSIInPlace,
  UNITS,
  type Unit,
} from '../../../shared/quantities/units'

const rel = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected)

describe('published conversion factors (reference sheet §10)', () => {
  it('U-PSI: 1 psi = 6.894757293 kPa (exact from lb, g_n, in; scipy.constants.psi, CONFIRMED)', () => {
    expect(rel(toSI(1, 'psi') / 1000, 6.894757293168361)).toBeLessThan(1e-12)
    expect(rel(PSI_PA, 6894.757293168361)).toBeLessThan(1e-12)
    // 9 significant digits in the sheet: half a unit in the last digit is 3.4e-9 relative.
    expect(rel(convert(1, 'kPa', 'psi'), 0.145037738)).toBeLessThan(3.5e-9)
  })

  it('U-INHG: 29.92 inHg = 101.3207 kPa (conventional inHg 3386.38864 Pa, COMPUTED; NIST SP 811 3.386389E+03 from memory)', () => {
    expect(Math.abs(toSI(29.92, 'inHg') / 1000 - 101.3207)).toBeLessThan(1e-4)
    expect(INHG_PA).toBeCloseTo(3386.38864, 5)
  })

  it('U-F: 77 °F = 298.15 K and 60 °F = 288.7056 K (scipy.constants.convert_temperature, CONFIRMED)', () => {
    expect(toSI(77, 'degF')).toBeCloseTo(298.15, 12)
    expect(toSI(60, 'degF')).toBeCloseTo(288.7056, 4)
    expect(toSI(32, 'degF')).toBeCloseTo(273.15, 12)
    expect(convert(100, 'degC', 'degF')).toBeCloseTo(212, 12)
  })

  it('1 bar = 100 000 Pa, 1 mbar = 1 hPa = 100 Pa (exact)', () => {
    expect(toSI(1, 'bar')).toBe(100000)
    expect(toSI(1, 'mbar')).toBe(100)
    expect(toSI(1, 'hPa')).toBe(100)
    expect(rel(convert(1, 'bar', 'psi'), 14.503774)).toBeLessThan(1e-7)
  })

  it('1 hp = 745.69987158227 W (scipy.constants.hp), 1 PS = 735.49875 W (75 kgf·m/s, exact)', () => {
    expect(rel(HP_W, 745.69987158227)).toBeLessThan(1e-12)
    expect(PS_W).toBeCloseTo(735.49875, 10)
  })

  it('1 lb/min = 0.007559872833 kg/s (COMPUTED), 1 mph = 0.44704 m/s (exact, international mile)', () => {
    expect(rel(LB_MIN_KG_S, 0.007559872833)).toBeLessThan(1e-10)
    expect(toSI(1, 'mph')).toBeCloseTo(0.44704, 14)
    expect(toSI(36, 'km/h')).toBeCloseTo(10, 12)
    expect(toSI(3600, 'kg/h')).toBeCloseTo(1, 14)
    expect(toSI(1000, 'g/s')).toBeCloseTo(1, 14)
  })

  it('temperature differences use the scale only (1 K = 1 °C = 1.8 °F, exact)', () => {
    expect(temperatureDifferenceToK(1.8, 'degF')).toBeCloseTo(1, 14)
    expect(temperatureDifferenceToK(5, 'degC')).toBe(5)
  })
})

// mathjs 15 `unit()` as an independent implementation of the factors. It has no 'inHg' or 'PS'
// (it reads PS as petaseconds) and spells mph as 'mi/h' and lb/min as 'lbm/min'.
const MATHJS_NAMES: [Unit, string, string][] = [
  ['degC', 'degC', 'K'], ['degF', 'degF', 'K'], ['K', 'K', 'K'],
  ['Pa', 'Pa', 'Pa'], ['kPa', 'kPa', 'Pa'], ['hPa', 'hPa', 'Pa'], ['mbar', 'mbar', 'Pa'], ['bar', 'bar', 'Pa'], ['psi', 'psi', 'Pa'],
  ['km/h', 'km/h', 'm/s'], ['mph', 'mi/h', 'm/s'], ['m/s', 'm/s', 'm/s'],
  ['g/s', 'g/s', 'kg/s'], ['kg/h', 'kg/h', 'kg/s'], ['lb/min', 'lbm/min', 'kg/s'], ['kg/s', 'kg/s', 'kg/s'],
  ['W', 'W', 'W'], ['kW', 'kW', 'W'], ['hp', 'hp', 'W'],
  ['s', 's', 's'], ['ms', 'ms', 's'], ['min', 'min', 's'], ['h', 'h', 's'],
]

describe('cross-check against mathjs unit()', () => {
  it.each(MATHJS_NAMES)('%s agrees with mathjs %s → %s', (ours, theirs, si) => {
    for (const value of [-40, 0, 1, 37.5, 1234.5]) {
      const expected = unit(value, theirs).toNumber(si)
      const actual = toSI(value, ours)
      // mathjs stores psi and hp rounded to about 1e-11 relative.
      expect(Math.abs(actual - expected)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(expected)))
    }
  })
})

describe('conversion API', () => {
  it('UNITS lists every unit named in issue 3, each with a conversion', () => {
    for (const u of ['degC', 'degF', 'K', 'kPa', 'hPa', 'mbar', 'bar', 'psi', 'inHg', 'km/h', 'mph', 'g/s', 'kg/h', 'lb/min', 'W', 'kW', 'hp', 'PS', 's', 'ms', '%', 'rpm']) {
      expect(isUnit(u)).toBe(true)
    }
    for (const list of Object.values(UNITS)) {
      for (const u of list) expect(Number.isFinite(conversionFor(u).scale)).toBe(true)
    }
    expect(quantityOf('psi')).toBe('pressure')
    expect(quantityOf('degF')).toBe('temperature')
  })

  it('fromSI inverts toSI', () => {
    for (const list of Object.values(UNITS)) {
      for (const u of list) expect(fromSI(toSI(12.345, u), u)).toBeCloseTo(12.345, 10)
    }
  })

  it('converts a column in place with one multiply-add, NaN stays NaN', () => {
    const column = new Float64Array([0, 100, Number.NaN, -40])
    const out = toSIInPlace(column, 'degC')
    expect(out).toBe(column)
    expect(Array.from(column.slice(0, 2))).toEqual([273.15, 373.15])
    expect(Number.isNaN(column[2])).toBe(true)
    expect(column[3]).toBeCloseTo(233.15, 12)
  })

  it('refuses mixing quantities and unknown units', () => {
    expect(() => convert(1, 'psi', 'degC')).toThrow(RangeError)
    expect(() => conversionFor('furlong' as Unit)).toThrow(/Unknown unit/)
  })

  it('parses header spellings', () => {
    expect(parseUnit('°C')).toBe('degC')
    expect(parseUnit(' kpa ')).toBe('kPa')
    expect(parseUnit('PSI')).toBe('psi')
    expect(parseUnit('1/min')).toBe('rpm')
    expect(parseUnit('lb/min')).toBe('lb/min')
    expect(parseUnit('psig')).toBeUndefined()
  })
})
