import { mountSuspended } from '@nuxt/test-utils/runtime'
import { afterEach, describe, expect, it } from 'vitest'
import DriveSummary from '~/components/report/DriveSummary.vue'
import type { DriveDetail, DriveSummary as Drive } from '#shared/types/report'

// A drive of 40 min running, 32 min moving and 3 min under boost, with one stop in traffic.
const drive: Drive = {
  runningS: 2400,
  movingS: 1920,
  boostedS: 180,
  deltaOverAmbientK: { median: 6.4, p95: 18.2, max: 31.5 },
  deltaOverAmbientUnderBoostK: { median: 21.3, p95: 29.8 },
  soakEvents: [
    { startS: 610, endS: 702, riseK: 7.6, recoveryS: 145 },
    { startS: 2210, endS: 2390, riseK: 4.1, recoveryS: null },
  ],
}
const detail: DriveDetail = {
  basis: 'moving',
  cruiseDeltaK: { median: 5.1, p95: 9.9, max: 14.2 },
  timeOverAmbientS: [{ overK: 10, s: 420 }, { overK: 20, s: 75 }, { overK: 30, s: 6 }],
  thirds: [{ fromS: 0, toS: 800, medianK: 5.2 }, { fromS: 800, toS: 1600, medianK: 6.8 }, { fromS: 1600, toS: 2400, medianK: 7.9 }],
  hasSpeed: true,
}

async function read(props: { drive: Drive, detail?: DriveDetail }) {
  const wrapper = await mountSuspended(DriveSummary, { props })
  const root = wrapper.find('[data-testid="drive-summary"]')
  const text = (s: string) => s.replace(/\s+/g, ' ').trim()
  return {
    paragraphs: root.findAll('p').map(p => text(p.text())),
    table: root.findAll('tr').map(tr => tr.findAll('th, td').map(cell => text(cell.text()))),
    events: root.findAll('[data-testid="soak-event"]').map(li => text(li.text())),
  }
}

describe('ReportDriveSummary', () => {
  afterEach(() => {
    useUnitsStore().temperature = 'C'
  })

  it('reads how long, how far over ambient and each soak event with its recovery time', async () => {
    const { paragraphs, table, events } = await read({ drive, detail })
    expect(paragraphs[0]).toBe('Engine running 40 min, moving 32 min, under boost 3 min. Temperature over ambient (charge temperature minus ambient temperature), from every usable sample:')
    expect(table).toEqual([
      ['While', 'Typical (median)', '95 % of the time under', 'Highest'],
      ['Moving', '6.4 K', '18.2 K', '31.5 K'],
      ['At cruise (no boost)', '5.1 K', '9.9 K', '14.2 K'],
      // No highest value is kept for the boosted samples: the table says so with a dash.
      ['Under boost', '21.3 K', '29.8 K', '—'],
    ])
    // 420 s reads in minutes, 75 s and 6 s in seconds (under 90 s).
    expect(paragraphs[1]).toBe('Time more than 10.0 K over ambient: 7 min, 20.0 K over ambient: 75 s and 30.0 K over ambient: 6 s. Over the drive (first, middle, last third): 5.2 K → 6.8 K → 7.9 K.')
    expect(events).toEqual([
      // 145 s of recovery is over 90 s, so it reads in whole minutes: 2.4 → 2 min.
      '610–702 s: up 7.6 K while slow or stopped; recovery time 2 min once moving again',
      '2210–2390 s: up 4.1 K while slow or stopped; no recovery seen before the next stop or the end of the log',
    ])
  })

  it('gives temperature differences in °F when the reader chose °F (a difference, so × 1.8 with no offset)', async () => {
    useUnitsStore().temperature = 'F'
    const { table, events } = await read({ drive, detail })
    expect(table[1]).toEqual(['Moving', '11.5 °F', '32.8 °F', '56.7 °F'])
    expect(events[0]).toBe('610–702 s: up 13.7 °F while slow or stopped; recovery time 2 min once moving again')
  })

  it('says why there are no soak events: none seen, or no road speed to tell a stop from a pull', async () => {
    const calm = await read({ drive: { ...drive, soakEvents: [] }, detail })
    expect(calm.paragraphs.at(-1)).toBe('None: the charge air did not heat up noticeably while the car was slow or stopped.')
    const blind = await read({ drive: { ...drive, soakEvents: [] }, detail: { ...detail, basis: 'running', hasSpeed: false } })
    expect(blind.paragraphs.at(-1)).toBe('The log has no road speed, so stops in traffic cannot be told apart.')
    expect(blind.table[1]![0]).toBe('Engine running')
  })
})
