import { describe, expect, it } from 'vitest'
import { DEFAULT_MINIMUM_NOTICE_MINUTES, DEFAULT_WHAT_TO_BRING, mailSettingsOf, siteSettingsOf } from '../../../../shared/domain/site-settings'

describe('mailSettingsOf', () => {
  it('gives the group defaults for an empty settings object', () => {
    expect(mailSettingsOf({})).toEqual({
      reminderOffsetsHours: [48, 3],
      quietHours: { start: '20:00', end: '08:00' },
      includeProcedureNames: false,
      patientCancel: 'request',
      whatToBring: DEFAULT_WHAT_TO_BRING,
      alarmMinutes: 60,
    })
  })

  it('keeps what a site chose', () => {
    expect(mailSettingsOf({
      reminderOffsetsHours: [24], quietHours: { start: '21:30', end: '07:00' }, includeProcedureNames: true,
      patientCancel: 'cancel', whatToBring: '  your glasses  ', alarmMinutes: 30,
    })).toEqual({
      reminderOffsetsHours: [24], quietHours: { start: '21:30', end: '07:00' }, includeProcedureNames: true,
      patientCancel: 'cancel', whatToBring: 'your glasses', alarmMinutes: 30,
    })
  })

  it('null quiet hours mean none; malformed ones fall back to the default', () => {
    expect(mailSettingsOf({ quietHours: null }).quietHours).toBeNull()
    expect(mailSettingsOf({ quietHours: { start: '25:00', end: '08:00' } }).quietHours).toEqual({ start: '20:00', end: '08:00' })
    expect(mailSettingsOf({ quietHours: 'evenings' }).quietHours).toEqual({ start: '20:00', end: '08:00' })
  })

  it('drops offsets that are not positive numbers and ignores odd values elsewhere', () => {
    expect(mailSettingsOf({ reminderOffsetsHours: [48, -1, 0, '3', 2] }).reminderOffsetsHours).toEqual([48, 2])
    expect(mailSettingsOf({ includeProcedureNames: 'yes', patientCancel: 'never', whatToBring: '   ', alarmMinutes: -5 })).toMatchObject({
      includeProcedureNames: false, patientCancel: 'request', whatToBring: DEFAULT_WHAT_TO_BRING, alarmMinutes: 60,
    })
  })
})

describe('siteSettingsOf', () => {
  it('adds the booking notice: a whole number of minutes, zero allowed, else the default', () => {
    expect(siteSettingsOf({}).minimumNoticeMinutes).toBe(DEFAULT_MINIMUM_NOTICE_MINUTES)
    expect(siteSettingsOf({ minimumNoticeMinutes: 0 }).minimumNoticeMinutes).toBe(0)
    expect(siteSettingsOf({ minimumNoticeMinutes: 120 }).minimumNoticeMinutes).toBe(120)
    expect(siteSettingsOf({ minimumNoticeMinutes: 12.5 }).minimumNoticeMinutes).toBe(DEFAULT_MINIMUM_NOTICE_MINUTES)
    expect(siteSettingsOf({ minimumNoticeMinutes: -10 }).minimumNoticeMinutes).toBe(DEFAULT_MINIMUM_NOTICE_MINUTES)
    expect(siteSettingsOf({ reminderOffsetsHours: [6] }).reminderOffsetsHours).toEqual([6])
  })
})
