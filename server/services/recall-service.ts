// Recall (issue 17 §1): finishing a visit of a recall kind sets the patient's next due date; booking
// a visit of that kind marks the recall booked; the Recall screen lists who is due and e-mails them
// (never again within the site's minimum interval). Each e-mail is a contact attempt: the recall's
// last_contact_at and an audit row `recall_mailed` (entity `recall`), the log the screen reads.
import type { SessionUser } from '#shared/types/auth'
import type { StoredTemplate } from '#shared/types/templates'
import type { RecallDto, RecallIntervalDto, RecallMailResult } from '#shared/types/recall'
import type { RecallIntervalsInput, RecallMailInput } from '#shared/schemas/recall'
import { mayMailRecall, nextDueDate, RECALL_KINDS, recallKindsOf, recallMonthsFor, recallSettingsOf, type RecallKind } from '#shared/domain/recall'
import { addDays, localDateAt, todayIn } from '#shared/utils/local-date'
import { useDb, type Db } from '../utils/db'
import { badRequest, notFound } from '../utils/errors'
import { requireSiteAccess } from '../utils/auth'
import { inTransaction } from '../utils/db-retry'
import { scheduleNowMs } from '../utils/clock'
import { findSiteDetail, findStoredSettings } from '../repositories/sites'
import { writeAudit } from '../repositories/audit-log'
import { enqueueMessage } from '../repositories/outbox'
import { findPatientRecallMonths, listDueRecalls, markRecallsBooked, noteRecallContact, savePatientRecallMonths, setRecallDue } from '../repositories/recalls'
import { findPatient } from '../repositories/patients'
import { composeRecallMail } from './mail/notice-mail'
import { addressee, patientRecord } from './mail/notice-facts'

function kindsOf(templates: readonly Pick<StoredTemplate, 'category'>[]): RecallKind[] {
  return recallKindsOf(templates.map((template) => template.category))
}

/** Inside the state change's transaction: a finished visit of a recall kind sets the next due date(s). */
export async function setRecallOnFinish(trx: Db, visit: { id: number; patientId: number; siteId: number; startMs: number; timeZone: string }, templates: readonly Pick<StoredTemplate, 'category'>[], userId: number | null): Promise<void> {
  const kinds = kindsOf(templates)
  if (!kinds.length) return
  const settings = recallSettingsOf((await findStoredSettings(trx, visit.siteId)) ?? {})
  const patientMonths = await findPatientRecallMonths(trx, visit.patientId)
  const visitDate = localDateAt(visit.startMs, visit.timeZone)
  for (const kind of kinds) {
    const months = recallMonthsFor(kind, settings, patientMonths)
    const dueDate = nextDueDate(visitDate, kind, settings, patientMonths)
    await setRecallDue(trx, visit.patientId, kind, dueDate)
    await writeAudit(trx, { userId, action: 'recall_due_set', entity: 'patient', entityId: visit.patientId, after: { kind, dueDate, visitId: visit.id, months, patientInterval: patientMonths[kind] !== undefined } })
  }
}

/** Inside the booking transaction: a visit of a recall kind answers the patient's recall of it. */
export async function markRecallsOnBooking(trx: Db, patientId: number, visitId: number, templates: readonly Pick<StoredTemplate, 'category'>[]): Promise<void> {
  await markRecallsBooked(trx, patientId, kindsOf(templates), visitId)
}

export async function listRecalls(query: { siteId: number; to?: string; kind?: RecallKind }, user: SessionUser): Promise<RecallDto[]> {
  requireSiteAccess(user, query.siteId)
  const db = useDb()
  const site = await findSiteDetail(db, query.siteId)
  if (!site) throw badRequest('siteId', 'no such site')
  return listDueRecalls(db, { siteId: query.siteId, toDate: query.to ?? addDays(todayIn(site.timeZone, scheduleNowMs()), 30), kind: query.kind })
}

/** Preview or send recall e-mails; a patient mailed within the site's minimum interval is skipped. */
export async function mailRecalls(input: RecallMailInput, user: SessionUser): Promise<RecallMailResult> {
  requireSiteAccess(user, input.siteId)
  return inTransaction(async (trx) => {
    const site = await findSiteDetail(trx, input.siteId)
    if (!site) throw badRequest('siteId', 'no such site')
    const settings = recallSettingsOf((await findStoredSettings(trx, input.siteId)) ?? {})
    const farAhead = addDays(todayIn(site.timeZone, scheduleNowMs()), 3 * 365)
    const recalls = await listDueRecalls(trx, { siteId: input.siteId, toDate: farAhead, ids: input.recallIds })
    const byId = new Map(recalls.map((recall) => [recall.id, recall]))
    const result: RecallMailResult = { preview: null, sent: [], skipped: [] }
    const nowMs = scheduleNowMs()
    for (const recallId of input.recallIds) {
      const recall = byId.get(recallId)
      if (!recall) { result.skipped.push({ recallId, reason: 'not a recall due at this site (booked already, or another site\'s patient)' }); continue }
      // The patient, or for a minor the guardian (the same rule as every patient message).
      const record = await patientRecord(trx, recall.patientId)
      const to = record ? addressee(record, todayIn(site.timeZone, nowMs)) : { skip: 'no such patient' }
      if ('skip' in to || !recall.emailConsent) { result.skipped.push({ recallId, reason: 'skip' in to ? `${to.skip}: call instead` : 'no consent to e-mail: call instead' }); continue }
      if (!mayMailRecall(recall.lastContactUtc ? Date.parse(recall.lastContactUtc) : null, nowMs, settings)) {
        result.skipped.push({ recallId, reason: `contacted less than ${settings.recallMailMinDays} days ago` })
        continue
      }
      if (!result.preview) {
        const { rendered } = composeRecallMail({ site, patient: to, kind: recall.kind, dueDate: recall.dueDate }, { from: '' })
        result.preview = { to: rendered.to, subject: rendered.subject, text: rendered.text }
      }
      if (input.preview) continue
      await enqueueMessage(trx, { kind: 'recall', visitId: null, siteId: input.siteId, dueAt: new Date(), payload: { recallId } })
      await noteRecallContact(trx, recallId, new Date(nowMs))
      await writeAudit(trx, { userId: user.id, action: 'recall_mailed', entity: 'recall', entityId: recallId, after: { patientId: recall.patientId, kind: recall.kind, dueDate: recall.dueDate } })
      result.sent.push(recallId)
    }
    return result
  })
}

// ---------------------------------------------------------------- a patient's own intervals

/** The patient's interval per kind beside the default of their preferred site (the group default without one). */
async function intervalsOf(db: Db, patientId: number, preferredSiteId: number | null): Promise<RecallIntervalDto[]> {
  const settings = recallSettingsOf(preferredSiteId === null ? {} : ((await findStoredSettings(db, preferredSiteId)) ?? {}))
  const own = await findPatientRecallMonths(db, patientId)
  return RECALL_KINDS.map((kind) => ({ kind, months: own[kind] ?? null, siteMonths: settings.recallMonths[kind], effectiveMonths: recallMonthsFor(kind, settings, own) }))
}

export async function patientRecallIntervals(patientId: number): Promise<RecallIntervalDto[]> {
  const db = useDb()
  const patient = await findPatient(db, patientId)
  if (!patient) throw notFound('No such patient.')
  return intervalsOf(db, patientId, patient.preferredSiteId)
}

/** Set or clear the patient's own intervals (audited `recall_interval_changed` on entity `patient`). */
export async function savePatientRecallIntervals(patientId: number, input: RecallIntervalsInput, user: SessionUser): Promise<RecallIntervalDto[]> {
  return inTransaction(async (trx) => {
    const patient = await findPatient(trx, patientId)
    if (!patient) throw notFound('No such patient.')
    const before = await findPatientRecallMonths(trx, patientId)
    await savePatientRecallMonths(trx, patientId, input, user.id)
    const after = await findPatientRecallMonths(trx, patientId)
    if (RECALL_KINDS.some((kind) => before[kind] !== after[kind])) {
      await writeAudit(trx, { userId: user.id, action: 'recall_interval_changed', entity: 'patient', entityId: patientId, before, after })
    }
    return intervalsOf(trx, patientId, patient.preferredSiteId)
  })
}
