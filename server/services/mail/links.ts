// The signed links every patient e-mail carries: the visit page (and its confirm, cancel and
// stop-reminders views), the current .ics, and the one-click reminder opt-out (RFC 8058).
import type { MailContext } from '../../repositories/mail-context'
import type { PatientLinks } from './compose'
import { signVisitToken } from '../../utils/visit-token'

export function visitToken(secret: string, context: MailContext): string {
  // Valid until the visit is over.
  return signVisitToken(secret, { id: context.visit.id, icalUid: context.visit.icalUid, expiresAtMs: context.visit.endUtc.getTime() })
}

export function patientLinks(publicUrl: string, token: string, visitId: number): PatientLinks {
  const base = publicUrl.replace(/\/+$/, '')
  const page = `${base}/visit/${encodeURIComponent(token)}`
  return {
    visitPage: page,
    confirm: `${page}?do=confirm`,
    cancel: `${page}?do=cancel`,
    stopReminders: `${page}?do=stop-reminders`,
    ics: `${base}/api/visits/${visitId}/ics?token=${encodeURIComponent(token)}`,
    unsubscribePost: `${base}/api/visit/${encodeURIComponent(token)}/reminders-off`,
  }
}
