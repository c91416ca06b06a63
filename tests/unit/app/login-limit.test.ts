import { describe, expect, it } from 'vitest'
import { BoundedCounter, backoffSeconds, limitKey } from '../../../server/utils/login-limit'

describe('sign-in limiter memory', () => {
  it('keys a 20 MB address with a fixed-length hash', () => {
    const key = limitKey('email', 'a'.repeat(20 * 1024 * 1024))
    expect(key.length).toBeLessThan(64)
    expect(limitKey('email', 'x@example.test')).toBe(limitKey('email', 'x@example.test'))
    expect(limitKey('email', 'x@example.test')).not.toBe(limitKey('email', 'y@example.test'))
  })

  it('keeps at most its bound of keys, forgetting the stalest first', () => {
    const counter = new BoundedCounter(100)
    for (let i = 0; i < 1000; i++) counter.add(`k${i}`, i, 60_000)
    expect(counter.size).toBe(100)
    expect(counter.get('k999', 1000, 60_000).count).toBe(1)
    expect(counter.get('k0', 1000, 60_000).count).toBe(0)
  })

  it('forgets a streak a window after its last failure', () => {
    const counter = new BoundedCounter()
    counter.add('k', 0, 1000)
    counter.add('k', 500, 1000)
    expect(counter.get('k', 1400, 1000).count).toBe(2)
    expect(counter.get('k', 1600, 1000).count).toBe(0)
  })
})

describe('sign-in backoff', () => {
  it('is free for the first tries, then doubles up to its cap', () => {
    expect([3, 4, 5, 6, 7, 8].map(n => backoffSeconds(n, 5, 900))).toEqual([0, 0, 1, 2, 4, 8])
    expect(backoffSeconds(40, 5, 900)).toBe(900)
    expect(backoffSeconds(1_000_000, 5, 900)).toBe(900)
  })
})
