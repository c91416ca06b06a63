import { readdirSync, readFileSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'
import {
  DEFAULT_DISPLAY_UNITS,
  DISPLAY_BASE,
  DISPLAY_QUANTITIES,
  DISPLAY_UNITS,
  displayChoicesText,
  displayUnitIds,
  displayUnitOf,
  displayUnitOr,
  fromDisplay,
  toDisplay,
} from '../../../shared/quantities/display'
import { convert, HP_W, isUnit, PS_W, PSI_PA } from '../../../shared/quantities/units'
import { formatFixed, formatPower, formatPressure, formatTemperature } from '../../../shared/utils/format'
import { formatEffectiveness } from '../../../utils/comparison'
import { formatTemperatureDifference, seriesConversion, temperatureIn } from '../../../utils/displayUnits'

describe('display units come from the unit catalogue', () => {
  it('offers °C/°F, kPa/bar/psi and kW/hp/PS, the first of each the default', () => {
    expect(displayUnitIds('temperature')).toEqual(['C', 'F'])
    expect(displayUnitIds('pressure')).toEqual(['kPa', 'bar', 'psi'])
    expect(displayUnitIds('power')).toEqual(['kW', 'hp', 'PS'])
    expect(DEFAULT_DISPLAY_UNITS).toEqual({ temperature: 'C', pressure: 'kPa', power: 'kW' })
  })

  it('shows every choice with the factor the engine converts logger columns with', () => {
    for (const quantity of DISPLAY_QUANTITIES) {
      for (const id of displayUnitIds(quantity)) {
        const unit = displayUnitOf(quantity, id)
        for (const value of [-40, 0, 1, 25, 220, 1234.5]) {
          const engine = convert(value, DISPLAY_BASE[quantity], unit)
          expect(Math.abs(toDisplay(value, quantity, id) - engine)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(engine)))
          expect(fromDisplay(toDisplay(value, quantity, id), quantity, id)).toBeCloseTo(value, 10)
        }
      }
    }
  })

  it('formats psi, hp and PS with the engine\'s exact factors, not copies of them', () => {
    // 1000 psi, 1000 hp and 1000 PS, worked back through the engine's constants: any other
    // factor shows in the third decimal.
    expect(formatPressure(1000 * PSI_PA / 1000, 'psi', 3)).toBe('1000.000 psi')
    expect(formatPower(1000 * HP_W / 1000, 'hp', 3)).toBe('1000.000 hp')
    expect(formatPower(1000 * PS_W / 1000, 'PS', 3)).toBe('1000.000 PS')
    expect(formatPressure(220, 'psi', 6)).toBe(`${convert(220, 'kPa', 'psi').toFixed(6)} psi`)
    expect(formatTemperature(-40, 'F')).toBe('−40.0 °F')
    // A bar is 100 kPa: one decimal more keeps the resolution of the kPa figure.
    expect(formatPressure(101.3, 'bar')).toBe('1.01 bar')
  })

  it('prints a negative figure with the typographic minus, and no sign on a value that rounds to zero', () => {
    expect(formatFixed(-1.46)).toBe('−1.5')
    expect(formatFixed(-0.04)).toBe('0.0')
    expect(formatFixed(-0.4, 0)).toBe('0')
    expect(formatFixed(2.25, 2)).toBe('2.25')
    expect(formatTemperatureDifference(-1.46, 'C')).toBe('−1.5 K')
    expect(formatTemperatureDifference(-1, 'F')).toBe('−1.8 °F')
    expect(formatPower(-3.04, 'kW', 1)).toBe('−3.0 kW')
    expect(formatPressure(-0.02, 'kPa')).toBe('0.0 kPa')
    // A faulty sensor can make an effectiveness negative.
    expect(formatEffectiveness(-0.052)).toBe('−5.2 %')
  })

  it('converts temperature differences by the scale only (1 K = 1.8 °F of difference, exact)', () => {
    expect(formatTemperatureDifference(10, 'C')).toBe('10.0 K')
    expect(formatTemperatureDifference(10, 'F')).toBe('18.0 °F')
    expect(convert(10 + 273.15, 'K', 'degF') - convert(273.15, 'K', 'degF')).toBeCloseTo(18, 10)
  })

  it('converts a chart series from the unit the API names to the display unit', () => {
    const inF = seriesConversion('K', { temperature: 'F', pressure: 'kPa' })
    expect(310.15 * inF.scale + inF.offset).toBeCloseTo(98.6, 10)
    const inPsi = seriesConversion('Pa', { temperature: 'C', pressure: 'psi' })
    expect(PSI_PA * inPsi.scale + inPsi.offset).toBeCloseTo(1, 12)
    const fromC = seriesConversion('°C', { temperature: 'F', pressure: 'kPa' })
    expect(100 * fromC.scale + fromC.offset).toBeCloseTo(212, 10)
    expect(seriesConversion('rpm', { temperature: 'F', pressure: 'psi' })).toEqual({ scale: 1, offset: 0 })
    expect(temperatureIn(37, 'F')).toBeCloseTo(98.6, 10)
  })

  it('falls back to the default for a saved unit no longer offered, and words the choices for a message', () => {
    expect(displayUnitOr('temperature', 'K')).toBe('C')
    expect(displayUnitOr('pressure', 'psi')).toBe('psi')
    expect(displayUnitOr('power', undefined)).toBe('kW')
    expect(displayChoicesText('temperature')).toBe('C (°C) or F (°F)')
    expect(displayChoicesText('pressure')).toBe('kPa, bar or psi')
  })
})

// The catalogue is the one place these numbers are written: a conversion factor copied into a
// page, a store or a route drifts the day one of them is corrected.
describe('no copies of the catalogue\'s conversions', () => {
  const root = join(__dirname, '../../..')
  const FOLDERS = ['pages', 'components', 'composables', 'utils', 'stores', 'layouts', 'server', 'shared', 'scripts', 'db']
  const CATALOGUE = ['shared/quantities/units.ts', 'shared/quantities/display.ts']
  const COPIES = /6\.8947|0\.14503|745\.69|0\.7456|735\.49|0\.7354|1\.3596|\b9 ?\/ ?5\b|\b5 ?\/ ?9\b|\b1\.8 ?\*|\* ?1\.8\b|273\.15|459\.67|0\.45359|1609\.344|\/ ?3\.6\b|\* ?3\.6\b/

  function sources(dir: string): string[] {
    return readdirSync(dir).flatMap((name) => {
      const path = join(dir, name)
      if (statSync(path).isDirectory()) return sources(path)
      return /\.(ts|vue|mjs)$/.test(name) ? [path] : []
    })
  }

  it('writes the factors only in shared/quantities', () => {
    const found = FOLDERS.flatMap(folder => sources(join(root, folder)))
      .map(path => relative(root, path))
      .filter(path => !CATALOGUE.includes(path))
      .flatMap(path => readFileSync(join(root, path), 'utf8').split('\n')
        .map((line, i) => ({ where: `${path}:${i + 1}`, line }))
        .filter(({ line }) => COPIES.test(line) && !/^\s*(\/\/|\*|\/\*)/.test(line)))
      .map(({ where, line }) => `${where}: ${line.trim()}`)
    expect(found).toEqual([])
  })

  it('lists each display choice once, each a unit of the catalogue', () => {
    for (const quantity of DISPLAY_QUANTITIES) {
      const ids = DISPLAY_UNITS[quantity].map(u => u.id)
      expect(new Set(ids).size).toBe(ids.length)
      for (const { unit } of DISPLAY_UNITS[quantity]) expect(isUnit(unit)).toBe(true)
    }
  })
})
