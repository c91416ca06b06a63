import { describe, expect, it } from 'vitest'
import { sizingNote } from '../../../server/utils/quote-pdf'

// The "Why this core" paragraph of a quote is read by the customer: what the quoted core would do on
// the design day, never its rank among cores the customer did not see.
const sizing = {
  design: { ambientC: 35 },
  result: {
    candidates: [
      { coreId: 4, rank: 1, predictedEffectiveness: 0.888, chargeTempC: 44.8, powerRecoveredPct: 9.4, pressureDropChangeKpa: -6.8, reason: 'Best: holds the charge 10 K over ambient…' },
      { coreId: 2, rank: 3, predictedEffectiveness: 0.8876, chargeTempC: 44.84, powerRecoveredPct: 9.24, pressureDropChangeKpa: -6.4, reason: '3rd of 4: holds the charge 10 K over ambient…' },
      { coreId: 7, rank: 4, predictedEffectiveness: 0.7, chargeTempC: 60.2, powerRecoveredPct: 0.4, pressureDropChangeKpa: 0.2, reason: '4th of 4: …' },
    ],
  },
}

describe('the quote\'s sizing note', () => {
  it('says what the quoted core would do, without its rank', () => {
    expect(sizingNote(sizing, 2, 'Bar-and-plate 600')).toBe('Bar-and-plate 600: predicted effectiveness 89 %, charge temperature about 45 °C on a 35 °C day, about 9.2 % of power recovered, 6.4 kPa less boost lost across the core, against the core fitted when the log was made. An estimate from this car\'s own log, to be confirmed by a log after fitting.')
  })

  it('leaves out a pressure-drop change too small to matter, and says nothing for a core not in the sizing', () => {
    expect(sizingNote(sizing, 7, 'Small core')).toBe('Small core: predicted effectiveness 70 %, charge temperature about 60 °C on a 35 °C day, about 0.4 % of power recovered, against the core fitted when the log was made. An estimate from this car\'s own log, to be confirmed by a log after fitting.')
    expect(sizingNote(sizing, 99, 'Other')).toBeNull()
    expect(sizingNote(null, 2, 'Bar-and-plate 600')).toBeNull()
  })
})
