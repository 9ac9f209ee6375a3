import { describe, expect, it } from 'vitest'
import { describeRule } from '../../../../../shared/domain/recurrence/describe'

describe('rule descriptions', () => {
  it.each([
    ['FREQ=WEEKLY;BYDAY=MO,WE', 'every Monday and Wednesday'],
    ['FREQ=WEEKLY;INTERVAL=2;BYDAY=FR', 'every other Friday'],
    ['FREQ=WEEKLY;INTERVAL=3;BYDAY=TU,TH', 'every 3 weeks on Tuesday and Thursday'],
    ['FREQ=WEEKLY;BYDAY=MO,TU,WE,TH,FR', 'every weekday'],
    ['FREQ=WEEKLY;BYDAY=MO,WE,FR', 'every Monday, Wednesday and Friday'],
    ['FREQ=WEEKLY', 'every week'],
    ['FREQ=DAILY', 'every day'],
    ['FREQ=DAILY;INTERVAL=2', 'every other day'],
    ['FREQ=MONTHLY;BYDAY=1MO', 'the first Monday of each month'],
    ['FREQ=MONTHLY;BYDAY=-1FR', 'the last Friday of each month'],
    ['FREQ=MONTHLY;INTERVAL=2;BYDAY=1SU,-1SU', 'the first and last Sunday of every other month'],
    ['FREQ=MONTHLY;COUNT=6;BYDAY=-2MO', 'the second to last Monday of each month, 6 times'],
    ['FREQ=MONTHLY;BYMONTHDAY=15', 'the 15th of each month'],
    ['FREQ=MONTHLY;BYMONTHDAY=1,-1', 'the 1st and last day of each month'],
    ['FREQ=MONTHLY;BYDAY=MO,TU,WE,TH,FR;BYSETPOS=-1', 'the last weekday of each month'],
    ['FREQ=MONTHLY;BYDAY=TU,WE,TH;BYSETPOS=3', 'the third Tuesday, Wednesday or Thursday of each month'],
    ['FREQ=YEARLY;COUNT=10;BYMONTH=6,7', 'every June and July, 10 times'],
    ['FREQ=HOURLY', 'an unreadable rule'],
  ])('describes %s as "%s"', (rule, text) => {
    expect(describeRule(rule)).toBe(text)
  })
})
