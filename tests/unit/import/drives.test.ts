// One file, several drives (issue 10): the splitter starts a new drive where time runs backwards by
// more than 10 s or jumps forward by more than 300 s (DRIVE_BREAK, common practice, no source).
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { DRIVE_BREAK, LogImportError, MIN_DRIVE_ROWS, importLog, listDrives } from '../../../server/analysis/index'

interface DriveSpec { startS: number, steps: number[] }

function csvOf(drives: DriveSpec[]): string {
  const lines = ['Time (s),Charge air temp (°C),Engine speed (rpm)']
  drives.forEach((drive, d) => {
    let t = drive.startS
    for (const step of drive.steps) {
      t += step
      lines.push(`${t.toFixed(3)},${(30 + d).toFixed(1)},${2000 + d}`)
    }
  })
  return lines.join('\n') + '\n'
}

async function thrown(promise: Promise<unknown>): Promise<LogImportError> {
  try {
    await promise
  }
  catch (error) {
    if (error instanceof LogImportError) return error
    throw error
  }
  throw new Error('expected a LogImportError')
}

// Steps inside a drive: 0.05–5 s, never a break.
const steps = fc.array(fc.double({ min: 0.05, max: 5, noNaN: true }), { minLength: MIN_DRIVE_ROWS, maxLength: 60 })

describe('the drive splitter', () => {
  it('finds every joined drive, with its rows and start, whether time restarts or jumps ahead', async () => {
    await fc.assert(fc.asyncProperty(fc.array(fc.record({ steps, restart: fc.boolean(), gapS: fc.double({ min: DRIVE_BREAK.jumpS + 1, max: 20_000, noNaN: true }) }), { minLength: 1, maxLength: 5 }), async (parts) => {
      // Each drive either restarts its time at 0…100 s (backwards, when the last one ran past that)
      // or starts gapS after the last one ended (a jump).
      const drives: DriveSpec[] = []
      let end = 0
      for (const [k, part] of parts.entries()) {
        const lastEnd = end
        const restartAt = (k * 7) % 100
        const restarts = k > 0 && part.restart && lastEnd - (restartAt + part.steps[0]!) > DRIVE_BREAK.backwardsS
        const startS = k === 0 ? 0 : restarts ? restartAt : lastEnd + part.gapS
        drives.push({ startS, steps: part.steps })
        end = startS + part.steps.reduce((a, b) => a + b, 0)
      }
      const csv = csvOf(drives)
      const found = await listDrives(csv)
      expect(found.map(d => d.rows)).toEqual(drives.map(d => d.steps.length))
      found.forEach((drive, k) => {
        expect(drive.index).toBe(k)
        expect(drive.startS).toBeCloseTo(drives[k]!.startS + drives[k]!.steps[0]!, 2)
        expect(drive.durationS).toBeCloseTo(drives[k]!.steps.slice(1).reduce((a, b) => a + b, 0), 2)
      })
      if (found.length > 1) {
        const error = await thrown(importLog(csv))
        expect(error.code).toBe('SEVERAL_DRIVES')
        expect(error.drives).toHaveLength(found.length)
      }
      // Each drive imported alone: its own rows, time from 0 and never falling.
      for (const drive of found) {
        const log = await importLog(csv, { drive: drive.index })
        expect(log.rowCount).toBe(drive.rows)
        expect(log.channels.timeS[0]).toBe(0)
        for (let i = 1; i < log.rowCount; i++) expect(log.channels.timeS[i]!).toBeGreaterThanOrEqual(log.channels.timeS[i - 1]!)
        expect(log.channels.rpm![0]).toBe(2000 + drive.index)
      }
    }), { numRuns: 40 })
  }, 60_000)

  it('never splits a file whose time only rises in steps shorter than the jump limit', async () => {
    await fc.assert(fc.asyncProperty(fc.array(fc.double({ min: 0.01, max: DRIVE_BREAK.jumpS - 1, noNaN: true }), { minLength: 3, maxLength: 80 }), async (gaps) => {
      const found = await listDrives(csvOf([{ startS: 0, steps: gaps }]))
      expect(found).toHaveLength(1)
      expect(found[0]!.rows).toBe(gaps.length)
    }), { numRuns: 100 })
  }, 60_000)

  it('drops a single out-of-order row as before, with a warning, instead of starting a drive', async () => {
    const csv = 'Time (s),Charge air temp (°C)\n' + Array.from({ length: 20 }, (_, i) => `${i},30`).join('\n').replace('\n12,30', '\n12,30\n5,30') + '\n'
    const log = await importLog(csv)
    expect(log.drives).toHaveLength(1)
    expect(log.rowCount).toBe(20)
    expect(log.warnings.some(w => w.code === 'TIME_WENT_BACKWARDS')).toBe(true)
  })

  it('refuses a drive number the file does not have, naming the range', async () => {
    const csv = csvOf([{ startS: 0, steps: Array(12).fill(1) }, { startS: 0, steps: Array(12).fill(1) }])
    const error = await thrown(importLog(csv, { drive: 2 }))
    expect(error.code).toBe('BAD_DRIVE')
    expect(error.message).toMatch(/numbered 0 to 1/)
  })

  it('describes what each drive contains', async () => {
    const csv = 'Time (s),Charge air temp (°C),Road speed (km/h),Manifold pressure abs (kPa)\n'
      + Array.from({ length: 12 }, (_, i) => `${i},${30 + i},${i * 10},${100 + i * 10}`).join('\n') + '\n'
      + Array.from({ length: 12 }, (_, i) => `${i},25,0,100`).join('\n') + '\n'
    const drives = await listDrives(csv)
    expect(drives.map(d => d.contains)).toEqual([
      'road speed up to 110 km/h; boost up to 210 kPa abs; charge temperature 30 to 41 °C',
      'standing still; boost up to 100 kPa abs; charge temperature 25 to 25 °C',
    ])
  })
})
