// A site's patient-mail settings (sites.settings JSON) with the group's defaults.
import type { QuietHours } from '#shared/domain/reminders'
import type { PatientCancelPolicy } from '#shared/types/outbox'

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
