// The plain facts a patient message states about a visit, in the site's zone, through the shared formatter.
import type { MailContext } from '../../repositories/mail-context'
import { displayStyleOf, formatDateTime, zoneLongName } from '#shared/utils/display-time'
import { mailSettingsOf, type MailSettings } from '#shared/domain/site-settings'
import { patientMinutesOf } from '#shared/domain/patient-time'
import { recipientOf, type RecipientChoice } from '#shared/domain/message-recipient'
import { localDateAt } from '#shared/utils/local-date'

export interface VisitFacts {
  settings: MailSettings
  /** "Monday, January 11, 2027 at 9:00 AM", in the site's clock and date order (shared/utils/display-time.ts) */
  whenLocal: string
  /** "Mon, Jan 11, 9:00 AM" for subjects */
  shortWhen: string
  /** "Pacific Standard Time" */
  zoneName: string
  /** Minutes the patient should plan for: the visit without the room's turnover afterwards. */
  minutes: number
  /** "about 1 hour 10 minutes" */
  howLong: string
  /** "Dental visit", or the procedure names when the site allows it. */
  what: string
}

export function durationWords(minutes: number): string {
  const hours = Math.floor(minutes / 60)
  const rest = minutes % 60
  const parts = [hours ? `${hours} hour${hours === 1 ? '' : 's'}` : '', rest ? `${rest} minute${rest === 1 ? '' : 's'}` : ''].filter(Boolean)
  return `about ${parts.join(' ') || '0 minutes'}`
}

/** The patient's own minutes: from the start until the last segment that is not room turnover. */
function patientMinutes(context: MailContext): number {
  return patientMinutesOf(context.visit.plan, Math.round((context.visit.endUtc.getTime() - context.visit.startUtc.getTime()) / 60_000))
}

export function visitFacts(context: MailContext): VisitFacts {
  const settings = mailSettingsOf(context.site.settings)
  const style = displayStyleOf(context.site)
  const minutes = patientMinutes(context)
  const names = [...new Set((context.visit.plan.items ?? []).map((item) => item.templateName).filter(Boolean))]
  return {
    settings,
    whenLocal: formatDateTime(context.visit.startUtc, style, 'long'),
    shortWhen: formatDateTime(context.visit.startUtc, style, 'short'),
    zoneName: zoneLongName(context.site.timeZone, context.visit.startUtc.getTime()),
    minutes,
    howLong: durationWords(minutes),
    what: settings.includeProcedureNames && names.length ? `Dental visit: ${names.join(', ')}` : 'Dental visit',
  }
}

/** Who a message about this visit goes to: the patient, or for a minor on the visit's local date the guardian. */
export function messageRecipient(context: MailContext, channel: 'email' | 'sms'): RecipientChoice {
  return recipientOf(context.patient, channel, localDateAt(context.visit.startUtc.getTime(), context.site.timeZone))
}
