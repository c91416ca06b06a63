import { describe, expect, it } from 'vitest'
import { formatMoney, formatPower, formatPressure, formatTemperature } from '../../../shared/utils/format'

describe('display formatting', () => {
  it('shows temperatures in °C or °F (77 °F = 25 °C, exact)', () => {
    expect(formatTemperature(25, 'C')).toBe('25.0 °C')
    expect(formatTemperature(25, 'F')).toBe('77.0 °F')
    expect(formatTemperature(null)).toBe('—')
    expect(formatTemperature(Number.NaN)).toBe('—')
  })

  it('shows pressures in kPa, bar or psi (1 psi = 6.894757 kPa, exact from its definition)', () => {
    expect(formatPressure(220, 'kPa')).toBe('220.0 kPa')
    expect(formatPressure(220, 'bar')).toBe('2.20 bar')
    // 220 kPa ÷ 6.894757293 kPa/psi = 31.908 psi, worked by hand (a factor off in the 3rd digit shows).
    expect(formatPressure(220, 'psi', 3)).toBe('31.908 psi')
  })

  it('shows power in kW, hp or PS (1 hp = 745.7 W, 1 PS = 735.5 W)', () => {
    expect(formatPower(110, 'kW')).toBe('110 kW')
    expect(formatPower(110, 'hp')).toBe('148 hp')
    expect(formatPower(110, 'PS')).toBe('150 PS')
    // By hand: 110 000 W ÷ 745.69987 W = 147.512 hp; ÷ 735.49875 W = 149.558 PS.
    expect(formatPower(110, 'hp', 2)).toBe('147.51 hp')
    expect(formatPower(110, 'PS', 2)).toBe('149.56 PS')
  })

  it('shows money in the workshop currency', () => {
    expect(formatMoney(64000, 'EUR')).toBe('€640.00')
    expect(formatMoney(null, 'GBP')).toBe('—')
  })
})
