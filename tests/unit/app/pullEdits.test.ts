import { describe, expect, it } from 'vitest'
import { editsAddingPull, editsKeepingLeftOut, editsRemovingPull, editsWithRule } from '../../../utils/pullEdits'
import { pull } from '../../fixtures/report'

describe('pull edits from the report', () => {
  it('removes an automatic pull by its automatic index', () => {
    const pulls = [pull(0, 40), pull(1, 42), pull(2, 44)]
    expect(editsRemovingPull(null, pulls[1]!)).toEqual({ remove: [1] })
  })

  it('uses the engine\'s automatic index, not the position in the list', () => {
    // Automatic pulls 0..4; 1 already removed and 3 masked out, so the third visible pull is automatic pull 4.
    const visible = pull(2, 46, { startS: 240, autoIndex: 4 })
    expect(editsRemovingPull({ remove: [1] }, visible)).toEqual({ remove: [1, 4] })
  })

  it('drops an added pull from the additions', () => {
    const added = pull(1, 41, { origin: 'added', autoIndex: null, startS: 100, endS: 106 })
    const edits = { add: [{ startS: 100.02, endS: 106 }, { startS: 300, endS: 305 }] }
    expect(editsRemovingPull(edits, added)).toEqual({ add: [{ startS: 300, endS: 305 }] })
  })

  it('turns an adjusted pull into a removed one', () => {
    const adjusted = pull(0, 40, { origin: 'adjusted', autoIndex: 0, startS: 58, endS: 67 })
    expect(editsRemovingPull({ adjust: [{ index: 0, startS: 58 }] }, adjusted)).toEqual({ remove: [0] })
  })

  it('adds the chart window as a pull, earliest time first', () => {
    expect(editsAddingPull({ remove: [2] }, { startS: 130.04, endS: 120.01 })).toEqual({ remove: [2], add: [{ startS: 120, endS: 130 }] })
  })
})

describe('the full-load rule and left-out pulls in the edits', () => {
  it('keeps the rule set by hand and the keep choice when a pull is removed', () => {
    const edits = { rule: { thresholdPct: 70 }, keepLeftOut: true }
    expect(editsRemovingPull(edits, pull(0, 40))).toEqual({ rule: { thresholdPct: 70 }, keepLeftOut: true, remove: [0] })
  })

  it('drops removals and adjustments when the rule changes (they name the old pulls), keeping added pulls', () => {
    const edits = { add: [{ startS: 10, endS: 20 }], remove: [2], adjust: [{ index: 1, startS: 5 }] }
    expect(editsWithRule(edits, { channel: 'pedal' as const, thresholdPct: 65 })).toEqual({ add: [{ startS: 10, endS: 20 }], rule: { channel: 'pedal', thresholdPct: 65 } })
    expect(editsWithRule({ rule: { thresholdPct: 65 } }, null)).toEqual({})
  })

  it('turns keeping the left-out pulls on and off', () => {
    expect(editsKeepingLeftOut({ remove: [1] }, true)).toEqual({ remove: [1], keepLeftOut: true })
    expect(editsKeepingLeftOut({ remove: [1], keepLeftOut: true }, false)).toEqual({ remove: [1] })
  })
})
