// The signed links every patient e-mail carries: the visit page and the current .ics.
import type { MailContext } from '../../repositories/mail-context'
import type { PatientLinks } from './compose'
import { signVisitToken } from '../../utils/visit-token'

export function visitToken(secret: string, context: MailContext): string {
  // Valid until the visit is over.
  return signVisitToken(secret, { id: context.visit.id, icalUid: context.visit.icalUid, expiresAtMs: context.visit.endUtc.getTime() })
}

export function patientLinks(publicUrl: string, token: string, visitId: number): PatientLinks {
  const base = publicUrl.replace(/\/+$/, '')
  return {
    visitPage: `${base}/visit/${encodeURIComponent(token)}`,
    ics: `${base}/api/visits/${visitId}/ics?token=${encodeURIComponent(token)}`,
  }
}
