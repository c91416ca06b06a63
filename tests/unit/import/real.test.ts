// Trimmed excerpts of the two real logs (attribution in tests/fixtures/real/README.md).
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { LogImportError, analyseLog, importLog, previewColumns } from '../../../server/analysis/index'

const fixture = (name: string) => ({ path: fileURLToPath(new URL(`../../fixtures/real/${name}`, import.meta.url)) })
const K = 273.15

describe('turbo-diesel excerpt (round-robin rows, time of day, engine stop)', () => {
  it('maps the pedal, not the throttle flap, and reads clock time', async () => {
    const log = await importLog(fixture('diesel-engine-stop-excerpt.csv'))
    expect(log.mapping.time?.unit).toBe('clock')
    expect(log.mapping.pedal?.column).toBe('Accelerator Pedal Position D [%]')
    expect(log.mapping.manifoldPressure?.unit).toBe('kPa')
    expect(log.mapping.ambientTemp?.column).toBe('Ambient Air Temperature [°C]')
    expect(log.rowCount).toBe(2400)
    expect(log.startClockS).toBeGreaterThan(17 * 3600)
  })

  it('masks the engine-off spike and the undershoot after restart; nothing above 100 °C is analysed', async () => {
    const log = await importLog(fixture('diesel-engine-stop-excerpt.csv'))
    const result = analyseLog(log)
    const reasons = new Set(result.masks.map(m => m.reason))
    expect(reasons.has('engine-off')).toBe(true)
    expect(reasons.has('restart-settle')).toBe(true)
    const { timeS, chargeTempK } = log.channels
    // Every sample hotter than 60 °C or colder than ambient − 3 K lies in a masked span.
    const inMask = (t: number) => result.masks.some(m => t >= m.startS - 1e-6 && t <= m.endS + 1e-6)
    let hot = 0
    for (let i = 0; i < timeS.length; i++) {
      const c = chargeTempK![i]!
      if (c > 60 + K || c < log.channels.ambientTempK![i]! - 3) {
        hot++
        expect(inMask(timeS[i]!)).toBe(true)
      }
    }
    expect(hot).toBeGreaterThan(50)
    expect(result.summary.pullCount).toBe(0)
    expect(result.warnings.some(w => w.code === 'NO_PULLS')).toBe(true)
  })
})

describe('petrol excerpt (CRLF, space after comma, trailing comma, empty units, no ambient)', () => {
  it('imports with the misspelled run-time column as time', async () => {
    const log = await importLog(fixture('petrol-start-excerpt.csv'))
    expect(log.format).toMatchObject({ lineEnding: 'crlf', trailingDelimiter: true })
    expect(log.mapping.time?.column).toBe('ENGINE_RUN_TINE ()')
    expect(log.mapping.chargeTemp?.column).toBe('INTAKE_AIR_TEMP ()')
    expect(log.mapping.baro?.column).toBe('ABSOLUTE_BAROMETRIC_PRESSURE ()')
    expect(log.channels.ambientTempK).toBeUndefined()
  })

  it('asks for the ambient temperature, then analyses', async () => {
    const log = await importLog(fixture('petrol-start-excerpt.csv'))
    expect(() => analyseLog(log)).toThrow(LogImportError)
    try {
      analyseLog(log)
    }
    catch (error) {
      expect((error as LogImportError).code).toBe('AMBIENT_REQUIRED')
      expect((error as Error).message).toMatch(/ambient/i)
    }
    const result = analyseLog(log, { ambientTempC: 30 })
    expect(result.summary.ambientSource).toBe('entered')
    expect(result.summary.baroSource).toBe('channel')
  })
})

describe('the upload form\'s messages about a petrol log with no units in its headings', () => {
  it('name the sensor and the unit as the mapping form does, never by their codes', async () => {
    const preview = await previewColumns(fixture('petrol-pulls-excerpt.csv'))
    const messages = preview.warnings.map(w => w.message)
    expect(messages).toContain('Column "INTAKE_AIR_TEMP ()" was taken as the charge temperature (after the intercooler), with a confidence of only 60 %. Check the mapping and correct it if that is wrong.')
    const units = messages.find(m => m.startsWith('These columns do not state their unit'))
    expect(units).toContain('"INTAKE_AIR_TEMP ()" as charge temperature (after the intercooler), in °C')
    expect(units).toContain('"INTAKE_MANIFOLD_PRESSURE ()" as boost (absolute, manifold pressure), in kPa')
    for (const message of messages) expect(message).not.toMatch(/\b(chargeTemp|manifoldPressure|baro|degC)\b/)
  })
})
