// Synthetic logs in every format the importer claims to read (issue 3, "Detect").
import { describe, expect, it } from 'vitest'
import { LogImportError, importLog, previewColumns } from '../../../server/analysis/index'

const K = 273.15

async function rejects(source: string | Uint8Array, code: string, mention?: RegExp): Promise<LogImportError> {
  const error = await importLog(source).then(() => undefined, (e: unknown) => e)
  expect(error).toBeInstanceOf(LogImportError)
  expect((error as LogImportError).code).toBe(code)
  if (mention) expect((error as LogImportError).message).toMatch(mention)
  return error as LogImportError
}

describe('delimiters, decimal comma, BOM, line endings', () => {
  it('reads comma, LF', async () => {
    const log = await importLog('Time (s),Charge air temp (°C),Engine speed (rpm)\n0,40,2000\n0.5,41,2100\n1,42,2200\n')
    expect(log.format.delimiter).toBe(',')
    expect(Array.from(log.channels.timeS)).toEqual([0, 0.5, 1])
    expect(log.channels.chargeTempK![2]).toBeCloseTo(42 + K, 4)
    expect(Array.from(log.channels.rpm!)).toEqual([2000, 2100, 2200])
  })

  it('reads semicolon with decimal comma, CRLF and a UTF-8 BOM', async () => {
    const text = '\uFEFFZeit [s];Ladeluft Temp [°C];Drehzahl [1/min]\r\n0,0;40,5;2000\r\n0,5;41,25;2100\r\n'
    const log = await importLog(new TextEncoder().encode(text))
    expect(log.format).toMatchObject({ delimiter: ';', decimalComma: true, bom: true, lineEnding: 'crlf' })
    expect(log.channels.timeS[1]).toBeCloseTo(0.5, 9)
    expect(log.channels.chargeTempK![1]).toBeCloseTo(41.25 + K, 4)
    expect(log.mapping.rpm?.unit).toBe('rpm')
  })

  it('reads tab-separated text with old Mac CR line endings', async () => {
    const log = await importLog('time\tcharge temp (degF)\tboost (psi)\r0\t104\t10\r1\t106\t12\r')
    expect(log.format).toMatchObject({ delimiter: '\t', lineEnding: 'cr' })
    expect(log.channels.chargeTempK![0]).toBeCloseTo(313.15, 3)
    expect(log.mapping.boost?.unit).toBe('psi')
  })

  it('ignores a trailing delimiter on every row, spaces after commas and empty unit brackets', async () => {
    const log = await importLog('RUN_TIME (),INTAKE_AIR_TEMP (),ENGINE_RPM (),\r\n0.000000, 35.000000, 800.000000,\r\n1.000000, 36.000000, 900.000000,\r\n')
    expect(log.format.trailingDelimiter).toBe(true)
    expect(Array.from(log.channels.rpm!)).toEqual([800, 900])
    expect(log.channels.chargeTempK![1]).toBeCloseTo(36 + K, 4)
  })

  it('reads UTF-16 LE text with a BOM', async () => {
    const text = 'Time (s),Charge air temp (°C)\n0,30\n1,31\n'
    const bytes = new Uint8Array(2 + text.length * 2)
    bytes[0] = 0xFF
    bytes[1] = 0xFE
    for (let i = 0; i < text.length; i++) bytes[2 + i * 2] = text.charCodeAt(i)
    const log = await importLog(bytes)
    expect(log.format.encoding).toBe('utf-16le')
    expect(log.channels.chargeTempK![1]).toBeCloseTo(31 + K, 4)
  })

  it('parses quoted fields through papaparse', async () => {
    const log = await importLog('"Time (s)","Charge air temp (°C)","Note"\n"0","40","a, b"\n"1","41","c"\n')
    expect(log.format.quoted).toBe(true)
    expect(log.channels.chargeTempK![1]).toBeCloseTo(41 + K, 4)
  })
})

describe('units', () => {
  it('reads units in brackets and parentheses and repairs a double-encoded degree sign', async () => {
    const log = await importLog('Time [ms],Charge air temp (Â°C),Ambient temp [K],MAP (bar),Speed (mph),Air mass (lb/min)\n0,40,300,2.0,60,20\n100,41,300,2.1,61,21\n')
    expect(log.format.repairedEncoding).toBe(true)
    expect(log.mapping.time?.unit).toBe('ms')
    expect(log.channels.timeS[1]).toBeCloseTo(0.1, 9)
    expect(log.mapping.chargeTemp?.unit).toBe('degC')
    expect(log.channels.ambientTempK![0]).toBeCloseTo(300, 3)
    expect(log.channels.manifoldPressurePa![0]).toBeCloseTo(200000, 0)
    expect(log.channels.speedMps![0]).toBeCloseTo(60 * 0.44704, 3)
    expect(log.channels.massAirFlowKgPerS![0]).toBeCloseTo(20 * 0.45359237 / 60, 6)
  })

  it('reads units glued to values (36C, 61kPa)', async () => {
    const log = await importLog('Time,Charge air temp,Manifold pressure\n0,36C,61kPa\n1,37C,62kPa\n')
    expect(log.mapping.chargeTemp).toMatchObject({ unit: 'degC', unitSource: 'values' })
    expect(log.channels.chargeTempK![1]).toBeCloseTo(37 + K, 4)
    expect(log.channels.manifoldPressurePa![0]).toBeCloseTo(61000, 0)
  })

  it('turns gauge boost into absolute pressure with ISA at the site altitude and says so', async () => {
    const log = await importLog('Time (s),Charge air temp (°C),Boost (kPa)\n0,40,100\n1,41,120\n', { altitudeM: 1000 })
    expect(log.mapping.baro).toMatchObject({ source: 'isa', altitudeM: 1000 })
    // ISA at 1000 m geometric: 89 876.28 Pa (reference sheet §1.3, ISA-Z1000).
    expect(log.channels.manifoldPressurePa![0]).toBeCloseTo(100000 + 89876.28, -1)
    expect(log.warnings.some(w => w.code === 'BARO_FROM_ISA')).toBe(true)
  })

  it('uses an entered baro value or a baro column for gauge boost', async () => {
    const entered = await importLog('Time (s),Charge air temp (°C),Boost (kPa)\n0,40,100\n', { baroKpa: 95 })
    expect(entered.mapping.baro).toMatchObject({ source: 'entered', value: 95 })
    expect(entered.channels.manifoldPressurePa![0]).toBeCloseTo(195000, 0)
    const column = await importLog('Time (s),Charge air temp (°C),Boost (kPa),Baro (kPa)\n0,40,100,98\n')
    expect(column.mapping.baro?.column).toBe('Baro (kPa)')
    expect(column.channels.manifoldPressurePa![0]).toBeCloseTo(198000, 0)
  })
})

describe('cells and rows', () => {
  it('treats empty and junk cells as missing, holds the last value within the staleness limit, and warns', async () => {
    const text = 'Time (s),Charge air temp (°C),Engine speed (rpm)\n0,40,1000\n1,,0x1F3A\n2,DEADBEEF,1200\n10,,1300\n'
    const log = await importLog(text, { staleLimitS: 5 })
    const t = log.channels.chargeTempK!
    expect(t[1]).toBeCloseTo(40 + K, 4) // held
    expect(t[2]).toBeCloseTo(40 + K, 4) // junk, held
    expect(Number.isNaN(t[3]!)).toBe(true) // 10 s after the last reading: stale
    const junk = log.warnings.find(w => w.code === 'JUNK_CELLS' && w.channel === 'chargeTemp')
    expect(junk?.line).toBe(4)
    expect(junk?.message).toMatch(/DEADBEEF/)
  })

  it('fills sparse round-robin rows by holding each channel', async () => {
    const rows = ['Time (s),Charge air temp (°C),Engine speed (rpm),Pedal (%)']
    for (let i = 0; i < 30; i++) {
      const cells = ['', '', '']
      cells[i % 3] = String(i % 3 === 0 ? 40 + i / 10 : i % 3 === 1 ? 2000 + i : 50)
      rows.push(`${(i * 0.1).toFixed(1)},${cells.join(',')}`)
    }
    const log = await importLog(rows.join('\n'))
    expect(log.channels.rpm![5]).toBe(2004)
    expect(log.channels.pedalPct![29]).toBe(50)
    expect(log.warnings.some(w => w.code === 'SPARSE_ROWS')).toBe(true)
  })

  it('reads time of day with a midnight wrap', async () => {
    const log = await importLog('Time,Charge air temp (°C)\n23:59:59.500,40\n23:59:59.900,40\n00:00:00.300,41\n00:00:01.000,41\n')
    expect(log.mapping.time?.unit).toBe('clock')
    expect(Array.from(log.channels.timeS).map(v => Number(v.toFixed(3)))).toEqual([0, 0.4, 0.8, 1.5])
    expect(log.warnings.some(w => w.code === 'MIDNIGHT_WRAP')).toBe(true)
  })

  it('reads elapsed H:MM:SS', async () => {
    const log = await importLog('Elapsed,Charge air temp (°C)\n0:00:00,40\n0:00:05,40\n1:00:05,41\n')
    expect(log.mapping.time?.unit).toBe('hms')
    expect(Array.from(log.channels.timeS)).toEqual([0, 5, 3605])
  })

  it('guesses milliseconds from the step when the header is silent', async () => {
    const log = await importLog('timestamp,charge temp\n1000,40\n1100,40\n1200,41\n')
    expect(log.mapping.time?.unit).toBe('ms')
    expect(log.channels.timeS[2]).toBeCloseTo(0.2, 9)
  })
})

describe('mapping', () => {
  it('gives a confidence per channel and lets explicit mapping JSON override it', async () => {
    const text = 'Time (s),IAT (°C),Charge air temp (°F),Throttle (%)\n0,30,104,10\n1,31,106,95\n'
    const auto = await previewColumns(text)
    expect(auto.mapping.chargeTemp?.column).toBe('Charge air temp (°F)')
    expect(auto.mapping.chargeTemp!.confidence).toBeGreaterThan(0.9)
    expect(auto.needsAmbientTemp).toBe(true)
    const explicit = await importLog(text, { mapping: '{"chargeTemp": {"column": "IAT (°C)", "unit": "degC"}, "throttle": null}' })
    expect(explicit.mapping.chargeTemp).toMatchObject({ column: 'IAT (°C)', source: 'explicit', confidence: 1 })
    expect(explicit.mapping.throttle).toBeUndefined()
    expect(explicit.channels.chargeTempK![0]).toBeCloseTo(30 + K, 4)
  })

  it('rejects a mapping to a missing column, naming it and listing the columns', async () => {
    const error = await importLog('Time (s),Charge air temp (°C)\n0,40\n', { mapping: { chargeTemp: { column: 'Nope', unit: 'degC' } } }).catch((e: unknown) => e)
    expect(error).toMatchObject({ code: 'UNKNOWN_COLUMN', column: 'Nope' })
    expect((error as Error).message).toMatch(/"Time \(s\)"/)
  })

  it('rejects a unit that does not fit the channel and invalid JSON', async () => {
    await expect(importLog('Time (s),T (°C)\n0,40\n', { mapping: { chargeTemp: { column: 'T (°C)', unit: 'psi' } } })).rejects.toMatchObject({ code: 'BAD_UNIT' })
    await expect(importLog('Time (s),T (°C)\n0,40\n', { mapping: '{nope' })).rejects.toMatchObject({ code: 'BAD_MAPPING' })
  })
})

describe('errors a person can act on', () => {
  it('empty file', () => rejects('', 'EMPTY_FILE', /empty/))
  it('blank lines only', () => rejects('\n\n  \n', 'EMPTY_FILE'))
  it('header only', () => rejects('Time (s),Charge air temp (°C)\n', 'HEADER_ONLY', /no data rows/))
  it('no temperature column', () => rejects('Time (s),Engine speed (rpm)\n0,1000\n', 'NO_TEMPERATURE_COLUMN', /chargeTemp/))
  it('no time column', () => rejects('Foo,Charge air temp (°C)\nabc,40\n', 'NO_TIME_COLUMN', /"Foo"/))
  it('a spreadsheet instead of CSV', () => rejects(new Uint8Array([0x50, 0x4B, 0x03, 0x04, 1, 2, 3]), 'NOT_TEXT', /CSV/))
  it('numbers where the header should be', () => rejects('1,2,3\n4,5,6\n', 'NO_COLUMNS', /header/))
  it('a time column that never reads', () => importLog('Time,Charge air temp (°C)\nabc,40\nxyz,41\n', { mapping: { time: { column: 'Time', unit: 's' } } }).then(
    () => expect.unreachable(),
    (e: unknown) => {
      expect(e).toMatchObject({ code: 'BAD_TIME_VALUE', line: 2, column: 'Time' })
      expect((e as Error).message).toMatch(/"abc"/)
    },
  ))
  it('too many rows', () => importLog('Time (s),Charge air temp (°C)\n0,1\n1,2\n2,3\n', { maxRows: 2 }).then(
    () => expect.unreachable(),
    (e: unknown) => expect(e).toMatchObject({ code: 'TOO_MANY_ROWS', line: 4 }),
  ))
  it('a missing file', () => importLog({ path: '/nonexistent/log.csv' }).then(
    () => expect.unreachable(),
    (e: unknown) => expect(e).toMatchObject({ code: 'FILE_UNREADABLE' }),
  ))
})
