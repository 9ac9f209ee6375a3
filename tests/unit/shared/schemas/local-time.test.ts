// Field schemas for local dates and times: zod's ISO date and time, with our messages.
import { describe, expect, it } from 'vitest'
import { calendarDate, LocalDateSchema, LocalEndTimeSchema, LocalTimeSchema } from '../../../../shared/schemas/local-time'

const messages = (result: { success: boolean; error?: { issues: { message: string }[] } }) => result.error?.issues.map((issue) => issue.message) ?? []

describe('local time fields', () => {
  it('take HH:mm on a 24-hour clock, and 24:00 only as an end', () => {
    expect(LocalTimeSchema.parse('07:30')).toBe('07:30')
    expect(messages(LocalTimeSchema.safeParse('7:30'))).toEqual(['must be a time such as 07:30 (HH:mm, 24-hour)'])
    expect(messages(LocalTimeSchema.safeParse('24:00'))).toEqual(['must be a time such as 07:30 (HH:mm, 24-hour)'])
    expect(messages(LocalTimeSchema.safeParse('07:30:00'))).toEqual(['must be a time such as 07:30 (HH:mm, 24-hour)'])
    expect(messages(LocalTimeSchema.safeParse(undefined))).toEqual(['is required'])
    expect(LocalEndTimeSchema.parse('24:00')).toBe('24:00')
    expect(LocalEndTimeSchema.parse('23:59')).toBe('23:59')
    expect(messages(LocalEndTimeSchema.safeParse('24:30'))).toEqual(['must be a time such as 16:00 (HH:mm, 24-hour)'])
  })
})

describe('local date fields', () => {
  it('say whether the shape is wrong or the date does not exist', () => {
    const birthDate = calendarDate('must be a date such as 1980-04-30')
    expect(birthDate.parse('2024-02-29')).toBe('2024-02-29') // a leap day
    expect(messages(birthDate.safeParse('2026-02-30'))).toEqual(['is not a real calendar date'])
    expect(messages(birthDate.safeParse('2026-13-01'))).toEqual(['is not a real calendar date'])
    expect(messages(birthDate.safeParse('2026-2-3'))).toEqual(['must be a date such as 1980-04-30'])
    expect(messages(birthDate.safeParse(20260203))).toEqual(['is required'])
  })

  it('keep dates inside the input bounds (shared/domain/input-bounds.ts)', () => {
    expect(messages(LocalDateSchema.safeParse('1999-12-31')).join(' ')).toMatch(/2000-01-01/)
    expect(LocalDateSchema.safeParse('2000-01-01').success).toBe(true)
  })
})
