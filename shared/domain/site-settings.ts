// A site's settings (sites.settings JSON) with the group's defaults: patient e-mail and the
// booking notice. Pure: the server reads them, the Sites screen shows and edits them.
import type { QuietHours } from './reminders'
import type { PatientCancelPolicy } from '../types/outbox'
import { messageChannelsOf, type MessageChannels } from './sms-channels'

export interface MailSettings {
  reminderOffsetsHours: number[]
  quietHours: QuietHours | null
  /** Off by default: messages say "dental visit" and how long, never the procedure, tooth or surface. */
  includeProcedureNames: boolean
  /** 'request': the front desk decides; 'cancel': the link cancels at once. */
  patientCancel: PatientCancelPolicy
  whatToBring: string
  /** Minutes before the visit the calendar alarm rings. */
  alarmMinutes: number
}

export const DEFAULT_WHAT_TO_BRING = 'a photo ID, your insurance card, and a list of any medicines you take'
const HHMM = /^([01]\d|2[0-3]):[0-5]\d$/

function quietHoursOf(value: unknown): QuietHours | null {
  if (value === null) return null
  const quiet = value as Partial<QuietHours> | undefined
  if (quiet && typeof quiet.start === 'string' && typeof quiet.end === 'string' && HHMM.test(quiet.start) && HHMM.test(quiet.end)) {
    return { start: quiet.start, end: quiet.end }
  }
  return { start: '20:00', end: '08:00' }
}

export function mailSettingsOf(settings: Record<string, unknown>): MailSettings {
  const offsets = Array.isArray(settings.reminderOffsetsHours)
    ? settings.reminderOffsetsHours.filter((hours): hours is number => typeof hours === 'number' && hours > 0)
    : [48, 3]
  return {
    reminderOffsetsHours: offsets,
    quietHours: quietHoursOf(settings.quietHours),
    includeProcedureNames: settings.includeProcedureNames === true,
    patientCancel: settings.patientCancel === 'cancel' ? 'cancel' : 'request',
    whatToBring: typeof settings.whatToBring === 'string' && settings.whatToBring.trim() ? settings.whatToBring.trim() : DEFAULT_WHAT_TO_BRING,
    alarmMinutes: typeof settings.alarmMinutes === 'number' && settings.alarmMinutes > 0 ? settings.alarmMinutes : 60,
  }
}

export interface SiteSettings extends MailSettings {
  /** How soon a visit may start, counted from now. */
  minimumNoticeMinutes: number
  /** E-mail and / or text for each visit message (issue 18). */
  messageChannels: MessageChannels
}

export const DEFAULT_MINIMUM_NOTICE_MINUTES = 60

export function siteSettingsOf(settings: Record<string, unknown>): SiteSettings {
  const notice = settings.minimumNoticeMinutes
  return {
    ...mailSettingsOf(settings),
    minimumNoticeMinutes: typeof notice === 'number' && Number.isInteger(notice) && notice >= 0 ? notice : DEFAULT_MINIMUM_NOTICE_MINUTES,
    messageChannels: messageChannelsOf(settings),
  }
}
