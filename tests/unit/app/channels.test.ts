import { describe, expect, it } from 'vitest'
import { allowedUnits, CHANNEL_IDS, CHANNELS, MAPPABLE_CHANNELS, mappingUnitLabel, TIME_FORMATS, VALUE_CHANNEL_IDS } from '../../../shared/quantities/channels'
import { isUnit, quantityOf, SI_UNIT, UNITS } from '../../../shared/quantities/units'

describe('the channel catalogue', () => {
  it('stores every channel in its quantity\'s SI unit', () => {
    for (const id of VALUE_CHANNEL_IDS) {
      const spec = CHANNELS[id]
      expect(spec.id).toBe(id)
      expect(spec.siUnit).toBe(SI_UNIT[spec.quantity])
      expect(quantityOf(spec.siUnit)).toBe(spec.quantity)
    }
  })

  it('offers every channel once in the column form, with the catalogue\'s label and units', () => {
    expect(MAPPABLE_CHANNELS.map(c => c.id).sort()).toEqual([...CHANNEL_IDS].sort())
    for (const channel of MAPPABLE_CHANNELS) {
      expect(channel.units).toEqual(allowedUnits(channel.id))
      if (channel.id === 'time') continue
      const spec = CHANNELS[channel.id]
      expect(channel.label).toBe(spec.detail ? `${spec.label} (${spec.detail})` : spec.label)
      expect(channel.units).toEqual(UNITS[spec.quantity])
      for (const unit of channel.units) expect(isUnit(unit) && quantityOf(unit)).toBe(spec.quantity)
    }
    expect(MAPPABLE_CHANNELS.filter(c => c.needed).map(c => c.id)).toEqual(['time', 'chargeTemp'])
  })

  it('names the channels with the glossary\'s words, in the order a person thinks of them', () => {
    expect(MAPPABLE_CHANNELS.slice(0, 4).map(c => c.label)).toEqual([
      'Time',
      'Charge temperature (after the intercooler)',
      'Pre-cooler temperature (before the intercooler)',
      'Ambient temperature',
    ])
    expect(MAPPABLE_CHANNELS.slice(4, 6).map(c => c.label)).toEqual(['Boost (absolute, manifold pressure)', 'Boost (gauge, above barometric pressure)'])
    expect(MAPPABLE_CHANNELS.find(c => c.id === 'speed')).toEqual({ id: 'speed', label: 'Road speed', units: ['km/h', 'mph', 'm/s'] })
  })

  it('words a unit of the column form as a person reads it', () => {
    expect(allowedUnits('time')).toEqual(TIME_FORMATS)
    expect(mappingUnitLabel('time', 'ms')).toBe('milliseconds')
    expect(mappingUnitLabel('time', 'hms')).toBe('h:mm:ss elapsed')
    expect(mappingUnitLabel('chargeTemp', 'degF')).toBe('°F')
    expect(mappingUnitLabel('boost', 'psi')).toBe('psi')
  })
})
