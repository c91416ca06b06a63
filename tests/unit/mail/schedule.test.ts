import { describe, expect, it } from 'vitest'
import { DEFAULT_RETRY_DELAYS, describeSendError, maxMailAttempts, nextAfterFailure, parseRetryDelays } from '../../../server/utils/mail-schedule'
import { deliverySentence, formatAttachmentSize } from '../../../shared/utils/outbox'

const now = new Date('2026-12-02T08:00:00Z')
const later = (ms: number) => new Date(now.getTime() + ms)

describe('the retry schedule', () => {
  it('reads delays written with units', () => {
    expect(parseRetryDelays('10s, 1m,5m,30m')).toEqual([10_000, 60_000, 300_000, 1_800_000])
    expect(parseRetryDelays('250ms,1.5s,2h')).toEqual([250, 1500, 7_200_000])
  })

  it('refuses a delay without a unit, saying how to write one', () => {
    expect(() => parseRetryDelays('10,1m')).toThrow(/"10" is not a delay.*10s, 1m/)
    expect(() => parseRetryDelays('-5s')).toThrow(/not a delay/)
  })

  it('tries five times by default: at once, then after 10 s, 1 min, 5 min and 30 min', () => {
    const delays = parseRetryDelays(DEFAULT_RETRY_DELAYS)
    expect(maxMailAttempts(delays)).toBe(5)
    expect(nextAfterFailure(1, delays, now)).toEqual({ status: 'queued', nextAttemptAt: later(10_000) })
    expect(nextAfterFailure(2, delays, now)).toEqual({ status: 'queued', nextAttemptAt: later(60_000) })
    expect(nextAfterFailure(3, delays, now)).toEqual({ status: 'queued', nextAttemptAt: later(300_000) })
    expect(nextAfterFailure(4, delays, now)).toEqual({ status: 'queued', nextAttemptAt: later(1_800_000) })
  })

  it('gives up after the last try', () => {
    const delays = [100, 200]
    expect(nextAfterFailure(2, delays, now).status).toBe('queued')
    expect(nextAfterFailure(3, delays, now)).toEqual({ status: 'failed', nextAttemptAt: null })
    expect(nextAfterFailure(9, delays, now).status).toBe('failed')
  })

  it('sends once and never again with an empty schedule', () => {
    expect(nextAfterFailure(1, [], now)).toEqual({ status: 'failed', nextAttemptAt: null })
  })

  it('keeps the mail server\'s words on one short line', () => {
    expect(describeSendError(new Error('connect ECONNREFUSED\n  127.0.0.1:9'))).toBe('connect ECONNREFUSED 127.0.0.1:9')
    expect(describeSendError('x'.repeat(800))).toHaveLength(498)
  })
})

describe('what a screen says about an e-mail', () => {
  const to = 'ana@example.test'
  it('says sent only when the mail server took it', () => {
    expect(deliverySentence('The invitation', { to, status: 'sent', error: null })).toBe('The invitation was e-mailed to ana@example.test.')
    expect(deliverySentence('The invitation', { to, status: 'queued', error: null })).toMatch(/^The invitation to ana@example.test is queued, not sent yet/)
    expect(deliverySentence('The invitation', { to, status: 'queued', error: null })).not.toMatch(/was e-mailed/)
    expect(deliverySentence('The invitation', { to, status: 'failed', error: 'connect ECONNREFUSED' })).toBe('The invitation could not be e-mailed to ana@example.test: connect ECONNREFUSED.')
  })

  it('shows attachment sizes in decimal units', () => {
    expect(formatAttachmentSize(512)).toBe('512 B')
    expect(formatAttachmentSize(48_213)).toBe('48.2 kB')
    expect(formatAttachmentSize(2_500_000)).toBe('2.5 MB')
    expect(formatAttachmentSize(null)).toBe('size unknown')
  })
})
