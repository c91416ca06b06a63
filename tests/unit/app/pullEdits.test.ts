import { describe, expect, it } from 'vitest'
import { editsAddingPull, editsRemovingPull } from '../../../utils/pullEdits'
import { pull } from '../../fixtures/report'

describe('pull edits from the report', () => {
  it('removes an automatic pull by its automatic index', () => {
    const pulls = [pull(0, 40), pull(1, 42), pull(2, 44)]
    expect(editsRemovingPull(null, pulls, [], pulls[1]!)).toEqual({ remove: [1] })
  })

  it('counts pulls already removed and those the masks dropped', () => {
    // Automatic pulls at 0..4; 1 already removed; the one at 150 s was masked out.
    const visible = [
      pull(0, 40, { startS: 60 }),
      pull(1, 44, { startS: 195 }),
      pull(2, 46, { startS: 240 }),
    ]
    const warnings = [{ code: 'PULL_MASKED', message: 'The pull at 150.0–157.0 s lies mostly in a masked span (engine stop or sensor artefact) and was left out.' }]
    expect(editsRemovingPull({ remove: [1] }, visible, warnings, visible[2]!)).toEqual({ remove: [1, 4] })
  })

  it('drops an added pull from the additions', () => {
    const added = pull(1, 41, { origin: 'added', startS: 100, endS: 106 })
    const edits = { add: [{ startS: 100.02, endS: 106 }, { startS: 300, endS: 305 }] }
    expect(editsRemovingPull(edits, [pull(0, 40), added], [], added)).toEqual({ add: [{ startS: 300, endS: 305 }] })
  })

  it('turns an adjusted pull into a removed one', () => {
    const adjusted = pull(0, 40, { origin: 'adjusted', startS: 58, endS: 67 })
    expect(editsRemovingPull({ adjust: [{ index: 0, startS: 58 }] }, [adjusted], [], adjusted)).toEqual({ remove: [0] })
  })

  it('adds the chart window as a pull, earliest time first', () => {
    expect(editsAddingPull({ remove: [2] }, { startS: 130.04, endS: 120.01 })).toEqual({ remove: [2], add: [{ startS: 120, endS: 130 }] })
  })
})
