// Reminder timing: offsets before the visit, local quiet hours (site settings), DST-safe zones.
import { describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { isQuiet, outsideQuietHours, planReminders } from '../../../../shared/domain/reminders'
import { givesUp, retryDelaySeconds } from '../../../../shared/domain/outbox-retry'

// Fixed dates on purpose: planReminders is pure and takes its "now" (nowMs), so these never go stale.
const LA = 'America/Los_Angeles'
const QUIET = { start: '20:00', end: '08:00' }
const at = (iso: string, zone = LA) => DateTime.fromISO(iso, { zone }).toMillis()
const local = (ms: number, zone = LA) => DateTime.fromMillis(ms, { zone }).toFormat("yyyy-MM-dd'T'HH:mm")

describe('quiet hours', () => {
  it('wraps past midnight', () => {
    expect(isQuiet(20 * 60, QUIET)).toBe(true)
    expect(isQuiet(7 * 60 + 59, QUIET)).toBe(true)
    expect(isQuiet(8 * 60, QUIET)).toBe(false)
    expect(isQuiet(19 * 60 + 59, QUIET)).toBe(false)
    expect(isQuiet(13 * 60, { start: '12:00', end: '14:00' })).toBe(true)
  })

  it('moves an early-morning reminder to the evening before, before quiet hours begin', () => {
    expect(local(outsideQuietHours(at('2027-01-12T06:00'), QUIET, LA))).toBe('2027-01-11T19:45')
    expect(local(outsideQuietHours(at('2027-01-12T21:30'), QUIET, LA))).toBe('2027-01-12T19:45')
    expect(local(outsideQuietHours(at('2027-01-12T10:00'), QUIET, LA))).toBe('2027-01-12T10:00')
  })
})

describe('planReminders', () => {
  it('sends 48 h and 3 h before a 14:00 visit, both outside quiet hours', () => {
    const plan = planReminders({ startMs: at('2027-01-14T14:00'), offsetsHours: [48, 3], quietHours: QUIET, timeZone: LA, nowMs: at('2027-01-01T09:00') })
    expect(plan.map((reminder) => [reminder.offsetHours, local(reminder.dueMs)])).toEqual([[48, '2027-01-12T14:00'], [3, '2027-01-14T11:00']])
  })

  it('sends the 3 h reminder of a 09:00 visit the evening before (06:00 is quiet)', () => {
    const plan = planReminders({ startMs: at('2027-01-14T09:00'), offsetsHours: [48, 3], quietHours: QUIET, timeZone: LA, nowMs: at('2027-01-01T09:00') })
    expect(plan.map((reminder) => local(reminder.dueMs))).toEqual(['2027-01-12T09:00', '2027-01-13T19:45'])
  })

  it('leaves out reminders already past when the visit is booked', () => {
    const plan = planReminders({ startMs: at('2027-01-14T14:00'), offsetsHours: [48, 3], quietHours: QUIET, timeZone: LA, nowMs: at('2027-01-14T09:00') })
    expect(plan.map((reminder) => reminder.offsetHours)).toEqual([3])
  })

  it('keeps wall-clock quiet hours across the DST change (IANA tz database; US rule 15 U.S.C. §260a)', () => {
    // 8 March 2026: clocks go from 02:00 to 03:00 in Los Angeles; 48 h before 07:30 on the 9th is 06:30 on the 7th (PST).
    const plan = planReminders({ startMs: at('2026-03-09T07:30'), offsetsHours: [48], quietHours: QUIET, timeZone: LA, nowMs: at('2026-03-01T09:00') })
    expect(local(plan[0]!.dueMs)).toBe('2026-03-06T19:45')
  })

  it('drops duplicates and nonsense offsets', () => {
    const plan = planReminders({ startMs: at('2027-01-14T14:00'), offsetsHours: [3, 3, -1, 0], quietHours: null, timeZone: LA, nowMs: at('2027-01-01T09:00') })
    expect(plan).toHaveLength(1)
  })
})

describe('retry backoff', () => {
  const policy = { baseSeconds: 30, maxSeconds: 3600, maxAttempts: 5 }
  it('doubles, stays within [half, full] of the exponential delay, and is capped', () => {
    expect(retryDelaySeconds(1, policy, 0)).toBe(15)
    expect(retryDelaySeconds(1, policy, 0.999)).toBeLessThan(30)
    expect(retryDelaySeconds(3, policy, 0)).toBe(60)
    expect(retryDelaySeconds(20, policy, 0.999)).toBeLessThanOrEqual(3600)
    expect(givesUp(4, policy)).toBe(false)
    expect(givesUp(5, policy)).toBe(true)
  })
})
