import { describe, expect, it } from 'vitest'
import { fieldLabel, fieldPathLabel } from '../../../shared/utils/fieldLabels'

describe('field names in messages a person reads', () => {
  it('uses the on-screen word for the request keys people meet', () => {
    expect(fieldLabel('vehicleId')).toBe('car')
    expect(fieldLabel('ownerId')).toBe('customer')
    expect(fieldLabel('fittedCoreId')).toBe('fitted core')
    expect(fieldLabel('ambientTempC')).toBe('ambient temperature')
    expect(fieldLabel('recordedOn')).toBe('day of the pulls')
    // Channels by the channel catalogue's words (the glossary's).
    expect(fieldLabel('chargeTemp')).toBe('charge temperature')
    expect(fieldLabel('baro')).toBe('barometric pressure')
    expect(fieldLabel('speed')).toBe('road speed')
    // A log's conditions by the upload form's words.
    expect(fieldLabel('baroKpa')).toBe('barometric pressure')
    expect(fieldLabel('humidityPct')).toBe('relative humidity')
  })

  it('spells an unlisted key out in words, without an "Id" ending', () => {
    expect(fieldLabel('someNewField')).toBe('some new field')
    expect(fieldLabel('customerNoteId')).toBe('customer note')
    expect(fieldLabel('cylinders')).toBe('cylinders')
  })

  it('names a list item by its place, counted from 1', () => {
    expect(fieldPathLabel(['lines', 2, 'unitPriceCents'])).toBe('price (line 3)')
    expect(fieldPathLabel(['design', 'ambientC'])).toBe('ambient temperature')
    expect(fieldPathLabel([])).toBe('')
  })
})
