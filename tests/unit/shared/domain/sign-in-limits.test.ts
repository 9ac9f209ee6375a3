// Sign-in limits: refusals per address, a growing but capped delay per account
// (OWASP ASVS 4.0.3 V2.2.1: anti-automation without locking the owner out).
import { describe, expect, it } from 'vitest'
import { refusalFor, signInDelayMs } from '../../../../shared/domain/sign-in-limits'

const DELAY = { delayFreeFailures: 3, delayBaseMs: 250, delayMaxMs: 3000 }
const LIMITS = { accountAddressFailureLimit: 10, addressFailureLimit: 100 }

describe('signInDelayMs', () => {
  it('costs nothing for the first few failures, then doubles up to the cap', () => {
    expect([0, 1, 2, 3, 4, 5, 6, 7, 8, 50, 10_000].map((failures) => signInDelayMs(failures, DELAY)))
      .toEqual([0, 0, 0, 250, 500, 1000, 2000, 3000, 3000, 3000, 3000])
  })

  it('never grows with more failures beyond the cap and never goes negative', () => {
    let previous = 0
    for (let failures = 0; failures <= 200; failures += 1) {
      const delay = signInDelayMs(failures, DELAY)
      expect(delay).toBeGreaterThanOrEqual(previous)
      expect(delay).toBeLessThanOrEqual(DELAY.delayMaxMs)
      previous = delay
    }
  })

  it('is off when the base or the cap is zero', () => {
    expect(signInDelayMs(50, { ...DELAY, delayBaseMs: 0 })).toBe(0)
    expect(signInDelayMs(50, { ...DELAY, delayMaxMs: 0 })).toBe(0)
  })
})

describe('refusalFor', () => {
  it('refuses an address that used up its tries on this account, and no other', () => {
    expect(refusalFor({ accountAddress: 9, address: 9 }, LIMITS)).toBeNull()
    expect(refusalFor({ accountAddress: 10, address: 10 }, LIMITS)).toBe('account_and_address')
    expect(refusalFor({ accountAddress: 0, address: 10 }, LIMITS)).toBeNull()
  })

  it('refuses an address that used up its tries across all accounts', () => {
    expect(refusalFor({ accountAddress: 0, address: 99 }, LIMITS)).toBeNull()
    expect(refusalFor({ accountAddress: 0, address: 100 }, LIMITS)).toBe('address')
  })
})
