import { describe, expect, it } from 'vitest'
import { givesUp, retryDelaySeconds, type RetryPolicy } from '../../../../shared/domain/outbox-retry'

const POLICY: RetryPolicy = { baseSeconds: 30, maxSeconds: 3600, maxAttempts: 8 }

describe('retryDelaySeconds', () => {
  it('doubles after each failure, half fixed and half random ("equal jitter", common practice, no source)', () => {
    expect(retryDelaySeconds(1, POLICY, 0)).toBe(15)
    expect(retryDelaySeconds(1, POLICY, 0.999)).toBeCloseTo(29.985)
    expect(retryDelaySeconds(2, POLICY, 0)).toBe(30)
    expect(retryDelaySeconds(3, POLICY, 0.5)).toBe(60 + 30)
  })

  it('never waits longer than the cap, however many failures', () => {
    expect(retryDelaySeconds(40, POLICY, 0.999)).toBeLessThan(3600)
    expect(retryDelaySeconds(40, POLICY, 0)).toBe(1800)
  })

  it('treats a first call with no failures like the first failure', () => {
    expect(retryDelaySeconds(0, POLICY, 0)).toBe(15)
  })
})

describe('givesUp', () => {
  it('stops at the policy\'s number of attempts', () => {
    expect(givesUp(7, POLICY)).toBe(false)
    expect(givesUp(8, POLICY)).toBe(true)
    expect(givesUp(9, POLICY)).toBe(true)
  })
})
