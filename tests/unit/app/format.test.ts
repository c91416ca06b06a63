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
    expect(formatPressure(6.894757293168361, 'psi')).toBe('1.0 psi')
  })

  it('shows power in kW, hp or PS (1 hp = 745.7 W, 1 PS = 735.5 W)', () => {
    expect(formatPower(110, 'kW')).toBe('110 kW')
    expect(formatPower(110, 'hp')).toBe('148 hp')
    expect(formatPower(110, 'PS')).toBe('150 PS')
  })

  it('shows money in the workshop currency', () => {
    expect(formatMoney(64000, 'EUR')).toBe('€640.00')
    expect(formatMoney(null, 'GBP')).toBe('—')
  })
})
