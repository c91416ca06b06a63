import { describe, expect, it } from 'vitest'
import { centsToMoneyText, parseMoneyToCents } from '../../../shared/utils/cores'
import { defaultCandidateIds, measuredText, optionalNumber, quoteLink } from '../../../utils/sizing'

describe('money typed in the major unit', () => {
  it.each([
    ['640', 64_000], ['640.5', 64_050], ['640.50', 64_050], ['0.07', 7], [' 12 ', 1_200],
  ])('reads %s as %i cents', (text, cents) => {
    expect(parseMoneyToCents(text)).toEqual({ cents })
  })

  it.each([
    ['640.505', /at most two decimals/], ['-5', /enter an amount/], ['1,240.00', /enter an amount/], ['12e3', /enter an amount/], ['100000.01', /at most 100,000/],
  ])('refuses %s', (text, message) => {
    const parsed = parseMoneyToCents(text)
    expect('error' in parsed && parsed.error).toMatch(message)
  })

  it('writes cents back as two decimals', () => {
    expect(centsToMoneyText(64_050)).toBe('640.50')
    expect(centsToMoneyText(null)).toBe('')
  })
})

describe('sizing page helpers', () => {
  const cores = [
    { id: 1, faceWidthMm: 300, faceHeightMm: 180, depthMm: 60 },
    { id: 2, faceWidthMm: 600, faceHeightMm: 300, depthMm: 76 },
    { id: 3, faceWidthMm: 280, faceHeightMm: 180, depthMm: 60 },
  ]
  it('offers the cores larger than the one fitted when the log was made', () => {
    expect(defaultCandidateIds(cores, cores[0])).toEqual([2])
    expect(defaultCandidateIds(cores, null)).toEqual([1, 2, 3])
  })

  it('builds the quote link the quotes page reads', () => {
    expect(quoteLink(4, 9, 2)).toBe('/quotes/new?vehicleId=4&sizingId=9&coreId=2')
  })

  it('says what the workshop measured with a core, or nothing when it measured nothing', () => {
    const evidence = { logCount: 2, measuredPullCount: 12, effectiveness: { median: 0.861, p10: 0.846, p90: 0.884 }, vehicles: [{}] }
    expect(measuredText(evidence)).toBe('86 % (85–88 %) over 12 pulls, 2 logs, 1 car')
    expect(measuredText({ ...evidence, measuredPullCount: 1, logCount: 1, effectiveness: { median: 0.7, p10: 0.7, p90: 0.7 } })).toBe('70 % over 1 pull, 1 log, 1 car')
    expect(measuredText({ ...evidence, measuredPullCount: 0, effectiveness: { median: null, p10: null, p90: null } })).toBeNull()
    expect(measuredText(null)).toBeNull()
  })

  it('leaves an empty number field out', () => {
    expect(optionalNumber('')).toBeUndefined()
    expect(optionalNumber(null)).toBeUndefined()
    expect(optionalNumber(35)).toBe(35)
  })
})
