// Column names as loggers really write them (issue 10): header lines of open, licensed datasets
// (each named with its licence in tests/fixtures/headers/corpus.json) and the spellings the issue
// lists, in any case, with any separator or unit suffix, and units glued to the values.
import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { describe, expect, it } from 'vitest'
import { importLog, previewColumns } from '../../../server/analysis/index'
import { normaliseName } from '../../../server/analysis/import/mapping'

interface Corpus {
  datasets: { name: string, licence: string, header: string, row: string, expect: Record<string, string> }[]
  variants: Record<string, string[] | string>
}
const corpus = JSON.parse(readFileSync(fileURLToPath(new URL('../../fixtures/headers/corpus.json', import.meta.url)), 'utf8')) as Corpus
const K = 273.15

describe('header corpus from open datasets', () => {
  it.each(corpus.datasets.map(d => [d.name, d] as const))('maps %s', async (_name, dataset) => {
    expect(dataset.licence.length).toBeGreaterThan(0)
    const rows = [dataset.row, dataset.row.replace(/^[^,]+/, m => (m.includes(':') ? m.replace(/\.\d+$/, '.521') : String(Number(m) + 1)))]
    const preview = await previewColumns(`${dataset.header}\n${rows.join('\n')}\n`)
    for (const [channel, column] of Object.entries(dataset.expect)) {
      expect({ channel, column: preview.mapping[channel as keyof typeof preview.mapping]?.column }).toEqual({ channel, column })
    }
  })
})

describe('spellings loggers write', () => {
  const cases = Object.entries(corpus.variants).filter(([key]) => key !== 'source').flatMap(([channel, names]) => (names as string[]).map(name => [channel, name] as const))
  const sample: Record<string, string> = { ambientTemp: '21', throttle: '35', chargeTemp: '41', boost: '12', manifoldPressure: '180', rpm: '3200', speed: '80', pedal: '40', engineLoad: '60', humidity: '55' }
  it.each(cases)('reads "%s" from a column called "%s"', async (channel, name) => {
    const preview = await previewColumns(`Time (s),${name}\n0,${sample[channel]}\n1,${sample[channel]}\n2,${sample[channel]}\n`)
    expect(preview.mapping[channel as keyof typeof preview.mapping]?.column).toBe(name)
  })

  it('normalises case, separators, camelCase, short forms and a trailing unit word', () => {
    expect(normaliseName('AMBIENT_AIR_TEMP')).toBe('ambient air temp')
    expect(normaliseName('AmbientTemp')).toBe('ambient temp')
    expect(normaliseName('Amb. temp')).toBe('ambient temp')
    expect(normaliseName('ambient_c')).toBe('ambient')
    expect(normaliseName('THROTTLE_POS')).toBe('throttle position')
    expect(normaliseName('ENGINE_RPM')).toBe('engine rpm')
  })
})

describe('units glued to the values', () => {
  it('reads 100kPa, 28C and 74,50% (decimal comma)', async () => {
    const log = await importLog('Time;MAP;Charge air temp;Pedal\n0;100kPa;28C;74,50%\n1;101kPa;29C;75,00%\n')
    expect(log.channels.manifoldPressurePa![0]).toBeCloseTo(100_000, 0)
    expect(log.channels.chargeTempK![0]).toBeCloseTo(28 + K, 4)
    expect(log.channels.pedalPct![0]).toBeCloseTo(74.5, 4)
  })
})

describe('columns no channel took', () => {
  it('are offered with the unit their values suggest for each channel they could be', async () => {
    const rows = Array.from({ length: 20 }, (_, i) => `${i},${40 + i},${300 + i},${(1.2 + i / 100).toFixed(2)},7`)
    const preview = await previewColumns(`Time (s),Charge air temp (°C),Sensor X,Sensor Y,Constant\n${rows.join('\n')}\n`)
    expect(preview.unrecognised).toEqual(['Sensor X', 'Sensor Y'])
    // 300-ish read as kelvin for a temperature; 1.2-ish as bar for a pressure (engine judgement, values' range).
    expect(preview.unitGuesses['Sensor X']).toMatchObject({ preCoolerTemp: 'K', ambientTemp: 'K' })
    expect(preview.unitGuesses['Sensor Y']).toMatchObject({ manifoldPressure: 'bar', boost: 'bar' })
  })
})
