// Whatever bytes arrive, the importer answers with data or with its own typed error, never a crash.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { LogImportError, importLog } from '../../../server/analysis/index'

async function outcome(source: string | Uint8Array): Promise<unknown> {
  try {
    await importLog(source)
    return 'ok'
  }
  catch (error) {
    return error
  }
}

describe('importer on arbitrary input', () => {
  it('throws nothing but LogImportError on arbitrary bytes', async () => {
    await fc.assert(fc.asyncProperty(fc.uint8Array({ maxLength: 400 }), async (bytes) => {
      const result = await outcome(bytes)
      expect(result === 'ok' || result instanceof LogImportError).toBe(true)
    }), { numRuns: 300 })
  })

  it('throws nothing but LogImportError on CSV-shaped noise', async () => {
    const cell = fc.oneof(fc.string({ maxLength: 6 }), fc.double().map(String), fc.constantFrom('Time', 'Charge air temp (°C)', '12:00:00', '"', '', '36C'))
    const line = fc.array(cell, { minLength: 1, maxLength: 5 }).chain(cells => fc.constantFrom(',', ';', '\t').map(d => cells.join(d)))
    await fc.assert(fc.asyncProperty(fc.array(line, { maxLength: 12 }), fc.constantFrom('\n', '\r\n', '\r'), async (lines, eol) => {
      const result = await outcome(lines.join(eol))
      expect(result === 'ok' || result instanceof LogImportError).toBe(true)
    }), { numRuns: 300 })
  })
})
