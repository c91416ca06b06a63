import { describe, expect, it } from 'vitest'
import { fieldLabel, fieldPathLabel } from '../../../shared/utils/fieldLabels'

describe('field names in messages a person reads', () => {
  it('uses the on-screen word for the request keys people meet', () => {
    expect(fieldLabel('vehicleId')).toBe('car')
    expect(fieldLabel('ownerId')).toBe('customer')
    expect(fieldLabel('fittedCoreId')).toBe('fitted core')
    expect(fieldLabel('ambientTempC')).toBe('ambient temperature')
    expect(fieldLabel('recordedOn')).toBe('day of the pulls')
    // The glossary's one word for the outside air pressure, on the upload form, the log's
    // conditions and a dyno run alike.
    expect(fieldLabel('baroKpa')).toBe('barometric pressure')
    expect(fieldLabel('humidityPct')).toBe('relative humidity')
    // Channels by the channel catalogue's words (the glossary's).
    expect(fieldLabel('chargeTemp')).toBe('charge temperature')
    expect(fieldLabel('baro')).toBe('barometric pressure')
    expect(fieldLabel('speed')).toBe('road speed')
    expect(fieldLabel('altitudeM')).toBe('site altitude')
  })

  it('never lets a unit ending of a request key reach the words', () => {
    // Keys of the request schemas that end in a unit (server/api, server/utils).
    const keys = ['altitudeM', 'baroKpa', 'humidityPct', 'taxRatePct', 'depositPct', 'powerKw', 'torqueNm', 'priceCents', 'costCents',
      'faceWidthMm', 'faceHeightMm', 'depthMm', 'inletDiameterMm', 'outletDiameterMm', 'weightKg', 'uaWPerK', 'ratedPowerKw', 'targetPowerKw',
      'roadSpeedKmh', 'labourRateCents', 'unitPriceCents', 'displacementL', 'thresholdPct', 'ambientTempC', 'referenceAmbientC']
    for (const key of keys) expect(fieldLabel(key), key).not.toMatch(/\b(m|kpa|pct|kw|nm|cents|mm|kg|w per k|kmh|l|c)$/i)
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
