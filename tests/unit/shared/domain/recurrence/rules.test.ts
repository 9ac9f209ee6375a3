import { describe, expect, it } from 'vitest'
import { validateRule } from '../../../../../shared/domain/recurrence/rules'

describe('validateRule', () => {
  it('accepts the rules the UI builds and the RFC examples', () => {
    expect(validateRule('FREQ=WEEKLY;BYDAY=MO,WE')).toBeNull()
    expect(validateRule('RRULE:FREQ=MONTHLY;BYDAY=1MO')).toBeNull()
    expect(validateRule('FREQ=MONTHLY;COUNT=3;BYDAY=TU,WE,TH;BYSETPOS=3')).toBeNull()
  })

  it.each([
    ['DTSTART:20260105T090000\nRRULE:FREQ=WEEKLY', /DTSTART/],
    ['FREQ=WEEKLY;DTSTART=20260105', /DTSTART/],
    ['FREQ=WEEKLY;COUNT=5;UNTIL=20260301T000000Z', /COUNT or by UNTIL/], // RFC 5545 §3.3.10
    ['FREQ=WEEKLY;UNTIL=20260301', /until date/],
    ['FREQ=SECONDLY', /more often than daily/],
    ['FREQ=MINUTELY;INTERVAL=15', /more often than daily/],
    ['FREQ=HOURLY', /more often than daily/],
    ['FREQ=FORTNIGHTLY', /not a known frequency/],
    ['BYDAY=MO', /needs a FREQ/],
    ['', /empty/],
    ['FREQ=WEEKLY;FREQ=DAILY', /each named once/],
    ['FREQ=DAILY;BYHOUR=9', /BYHOUR/],
    ['FREQ=WEEKLY;INTERVAL=0', /INTERVAL/],
    ['FREQ=WEEKLY;BYDAY=1MO', /monthly or yearly/], // RFC 5545 §3.3.10
    ['FREQ=WEEKLY;BYDAY=MON', /not a weekday/],
    ['FREQ=WEEKLY;X-NAME=1', /not a supported rule part/],
  ])('rejects %j', (rule, reason) => {
    expect(validateRule(rule)).toMatch(reason)
  })
})
