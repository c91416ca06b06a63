// Logs written by older Windows programs (Windows-1252) or as UTF-16: the upload form's detection
// and the import read the same bytes with the same decoder, so both see the same clean headers.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { detectEncoding } from '../../../server/analysis/import/detect'
import { importLog, previewColumns } from '../../../server/analysis/index'

const K = 273.15
const HEADER = 'Time (s);Charge air temp (°C);Ambient temp (°C);Engine speed (rpm)'

// Windows-1252 puts `°` in one byte, 0xB0 (Latin-1 and Windows-1252 agree on it).
function windows1252(text: string): Uint8Array {
  return Uint8Array.from(text, (c) => {
    const code = c.charCodeAt(0)
    if (code > 0xFF) throw new Error(`not in the test's Latin-1 range: ${c}`)
    return code
  })
}

function utf16le(text: string): Uint8Array {
  return new Uint8Array([0xFF, 0xFE, ...new Uint8Array(Buffer.from(text, 'utf16le'))])
}

function rows(count: number) {
  let text = `${HEADER}\r\n`
  for (let i = 0; i < count; i++) text += `${(i / 10).toFixed(1)};${(40 + (i % 50) / 10).toFixed(1)};25.0;${2000 + (i % 100) * 10}\r\n`
  return text
}

const folder = mkdtempSync(join(tmpdir(), 'densitas-encodings-'))
afterAll(() => rmSync(folder, { recursive: true, force: true }))

describe('detectEncoding', () => {
  it('tells UTF-8, Windows-1252 and UTF-16 apart', () => {
    expect(detectEncoding(new TextEncoder().encode('Temp (°C)\n40\n'))).toEqual({ encoding: 'utf-8', bom: false })
    expect(detectEncoding(new TextEncoder().encode('Time (s)\n0\n'))).toEqual({ encoding: 'utf-8', bom: false })
    expect(detectEncoding(windows1252('Temp (°C)\n40\n'))).toEqual({ encoding: 'windows-1252', bom: false })
    expect(detectEncoding(utf16le('Temp (°C)\n40\n'))).toEqual({ encoding: 'utf-16le', bom: true })
  })

  it('keeps UTF-8 when the sample ends in the middle of a character', () => {
    const bytes = new TextEncoder().encode('Temp (°C)\n40 °')
    expect(detectEncoding(bytes.subarray(0, bytes.length - 1))).toEqual({ encoding: 'utf-8', bom: false })
  })
})

describe('a Windows-1252 log', () => {
  it('is imported with its degree signs, and detection from its first bytes sees the same headers', async () => {
    const bytes = windows1252(rows(40))
    const log = await importLog(bytes)
    expect(log.format.encoding).toBe('windows-1252')
    expect(log.columns.map(c => c.header)).toEqual(HEADER.split(';'))
    expect(log.mapping.chargeTemp).toMatchObject({ column: 'Charge air temp (°C)', unit: 'degC' })
    expect(log.channels.chargeTempK![1]).toBeCloseTo(40.1 + K, 4)

    const preview = await previewColumns(bytes.subarray(0, 300))
    expect(preview.columns.map(c => c.header)).toEqual(log.columns.map(c => c.header))
    expect(preview.headerSignature).toBe(log.headerSignature)
  })

  it('streams from a file larger than one read chunk', async () => {
    const path = join(folder, 'cp1252.csv')
    writeFileSync(path, windows1252(rows(40_000)))
    const log = await importLog({ path })
    expect(log.format.encoding).toBe('windows-1252')
    expect(log.rowCount).toBe(40_000)
    expect(log.channels.chargeTempK![39_999]).toBeCloseTo(44.9 + K, 4)
  })
})

describe('a UTF-16 LE log with a byte-order mark', () => {
  it('is read from a file as from bytes, and detection from its first bytes sees the same headers', async () => {
    const bytes = utf16le(rows(30_000))
    const path = join(folder, 'utf16.csv')
    writeFileSync(path, bytes)
    const fromFile = await importLog({ path })
    const fromBytes = await importLog(bytes)
    expect(fromFile.format).toMatchObject({ encoding: 'utf-16le', bom: true })
    expect(fromFile.rowCount).toBe(30_000)
    expect(Array.from(fromFile.channels.chargeTempK!)).toEqual(Array.from(fromBytes.channels.chargeTempK!))

    // An odd number of bytes: the sample cut inside a character, as a browser's slice may.
    const preview = await previewColumns(bytes.subarray(0, 501))
    expect(preview.columns.map(c => c.header)).toEqual(HEADER.split(';'))
    expect(preview.headerSignature).toBe(fromFile.headerSignature)
  })
})
