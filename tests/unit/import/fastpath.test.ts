// The byte-level reader must give exactly what papaparse gives on the same input.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { analyseSample } from '../../../server/analysis/import/detect'
import { parseBytesFast, parseTextWithPapa } from '../../../server/analysis/import/parse'
import type { ParsePlan } from '../../../server/analysis/import/parse'
import { resolveMapping } from '../../../server/analysis/import/mapping'
import type { ValueChannelId } from '../../../shared/quantities/channels'
import type { Unit } from '../../../shared/quantities/units'

function planFor(text: string): ParsePlan {
  const sample = analyseSample(text, 'utf-8', false, true)
  const mapping = resolveMapping(sample.columns, undefined)
  const byHeader = new Map(sample.columns.map(c => [c.header, c]))
  const slots = (Object.keys(mapping) as (keyof typeof mapping)[]).filter(k => k !== 'time').map(channel => ({
    channel: channel as ValueChannelId,
    columnIndex: byHeader.get(mapping[channel]!.column!)!.index,
    header: mapping[channel]!.column!,
    unit: mapping[channel]!.unit as Unit,
  }))
  const time = byHeader.get(mapping.time!.column!)!
  return {
    format: sample.format,
    columnCount: sample.columns.length,
    timeColumnIndex: time.index,
    timeHeader: time.header,
    timeFormat: mapping.time!.unit as ParsePlan['timeFormat'],
    slots,
    staleLimitS: 5,
    maxRows: 1e6,
    expectedRows: 4,
  }
}

function expectSame(text: string): void {
  const plan = planFor(text)
  const fast = parseBytesFast(new TextEncoder().encode(text), plan)
  const papa = parseTextWithPapa(text, plan)
  expect(fast.rowCount).toBe(papa.rowCount)
  expect(Array.from(fast.timeS)).toEqual(Array.from(papa.timeS))
  fast.values.forEach((column, i) => expect(Array.from(column)).toEqual(Array.from(papa.values[i]!)))
  expect(fast.stats).toEqual(papa.stats)
}

describe('fast path agrees with papaparse', () => {
  it('on plain numbers, junk, empty cells, glued units, CRLF and decimal comma', () => {
    expectSame('Time (s),Charge air temp (°C),Engine speed (rpm),Pedal (%)\n0,40.25,1000,-1.5\n0.1,,1200,0x1F\n0.2,41C,1300e0,99.9\n0.3,  42 ,1400 ,100\n')
    expectSame('Zeit (s);Ladeluft Temp (°C);Drehzahl (rpm)\r\n0,0;40,5;1000\r\n0,1;40,75;1100\r\n')
    expectSame('Time,Charge air temp (°C)\n17:22:57.475,40\n17:22:58.001,41\n23:59:59.999,42\n')
  })

  it('on random numeric tables', () => {
    const cell = fc.oneof(
      fc.double({ min: -1e6, max: 1e6, noNaN: true }).map(v => String(v)),
      fc.integer({ min: -100000, max: 100000 }).map(v => String(v)),
      fc.double({ min: 0, max: 500, noNaN: true }).map(v => v.toFixed(3)),
      fc.constantFrom('', ' ', '-', 'abc', '1.2.3', '12kPa', '5%', '1e3', '.5', '+7'),
    )
    fc.assert(fc.property(fc.array(fc.tuple(cell, cell, cell), { minLength: 1, maxLength: 40 }), (rows) => {
      const lines = ['Time (s),Charge air temp (°C),Engine speed (rpm),Pedal (%)']
      rows.forEach((r, i) => lines.push(`${(i * 0.1).toFixed(1)},${r.join(',')}`))
      expectSame(`${lines.join('\n')}\n`)
    }), { numRuns: 200 })
  })
})
