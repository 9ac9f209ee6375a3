// A site's waitlist settings (shared/domain/waitlist-settings.ts): how long an offer stays open.
import { describe, expect, it } from 'vitest'
import { DEFAULT_OFFER_HOURS, waitlistSettingsOf } from '../../../../shared/domain/waitlist-settings'

describe('offer hours', () => {
  it('default to 2 hours when the site has not set them (common practice, no source)', () => {
    expect(DEFAULT_OFFER_HOURS).toBe(2)
    expect(waitlistSettingsOf({})).toEqual({ offerHours: 2 })
  })

  it('keep a site\'s own value from above 0 up to 72 hours, fractions included', () => {
    expect(waitlistSettingsOf({ offerHours: 0.5 }).offerHours).toBe(0.5)
    expect(waitlistSettingsOf({ offerHours: 24 }).offerHours).toBe(24)
    expect(waitlistSettingsOf({ offerHours: 72 }).offerHours).toBe(72)
  })

  it('fall back to the default for anything else stored', () => {
    for (const stored of [0, -1, 73, '4', null, Number.NaN, Number.POSITIVE_INFINITY]) expect(waitlistSettingsOf({ offerHours: stored }).offerHours).toBe(2)
  })
})
