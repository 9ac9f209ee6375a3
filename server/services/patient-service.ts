// Patient records (issues 6 and 16): registering, opening, editing, finding likely duplicates and
// merging. Records are group-wide; every opening is audited, every change keeps the old values.
import type { SessionUser } from '#shared/types/auth'
import type { DuplicateCandidateDto, MergedPatientAnswer, PatientMergeResult, PatientRecordDto } from '#shared/types/patients'
import type { NewPatientInput } from '#shared/schemas/visits'
import type { ConsentSource, DuplicateCheckInput, PatientEditInput, PatientFieldsInput, PatientMergeInput } from '#shared/schemas/patients'
import { MERGE_FIELDS } from '#shared/schemas/patients'
import { findDuplicates, type PatientIdentity } from '#shared/domain/patient-duplicates'
import { formatDateTime } from '#shared/utils/display-time'
import { requireSiteAccess } from '../utils/auth'
import { useDb, type Db } from '../utils/db'
import { inTransaction } from '../utils/db-retry'
import { badRequest, conflict, notFound } from '../utils/errors'
import {
  duplicateCandidates, findPatientRow, insertPatient, patientColumns, toPatientRecordDto, updatePatientIfVersion, type PatientRecordRow,
} from '../repositories/patients'
import { mergedConsent } from '#shared/domain/merge-consent'
import { insertMerge, markMerged, moveAuditTrail, moveRecallAndWaitlist, moveVisits, overlappingVisits } from '../repositories/patient-merges'
import { findSite } from '../repositories/sites'
import { writeAudit } from '../repositories/audit-log'

const STALE = 'Someone else saved this patient since you opened the record. Reload to see their changes, then edit again.'

async function assertPreferredSite(db: Db, user: SessionUser, siteId: number | null | undefined): Promise<void> {
  if (!siteId) return
  requireSiteAccess(user, siteId)
  if (!(await findSite(db, siteId))) throw badRequest('preferredSiteId', 'is not a site')
}

/** Consent columns: switched on now → today's date and the source; kept on → kept; off → cleared. */
function consentColumns(before: PatientRecordRow | undefined, input: PatientFieldsInput & { emailConsentSource?: ConsentSource | null; smsConsentSource?: ConsentSource | null }, defaultSource: ConsentSource) {
  const now = new Date()
  const channel = (on: boolean, wasOn: boolean, wasAt: Date | null, wasSource: ConsentSource | null, source: ConsentSource | null | undefined) =>
    !on ? { at: null, source: null }
      : wasOn ? { at: wasAt ?? now, source: source ?? wasSource ?? defaultSource }
        : { at: now, source: source ?? defaultSource }
  const email = channel(input.emailConsent, Boolean(before?.email_consent), before?.email_consent_at ?? null, before?.email_consent_source ?? null, input.emailConsentSource)
  const sms = channel(input.smsConsent, Boolean(before?.sms_consent), before?.sms_consent_at ?? null, before?.sms_consent_source ?? null, input.smsConsentSource)
  return { email_consent_at: email.at, email_consent_source: email.source, sms_consent_at: sms.at, sms_consent_source: sms.source }
}

/** A preferred site must be one of the caller's (403) and exist (400). */
export function registerPatient(user: SessionUser, input: NewPatientInput, ip: string): Promise<PatientRecordDto> {
  if (input.preferredSiteId) requireSiteAccess(user, input.preferredSiteId)
  return inTransaction(async (trx) => {
    await assertPreferredSite(trx, user, input.preferredSiteId)
    const id = await insertPatient(trx, { ...patientColumns(input), ...consentColumns(undefined, input, 'desk') })
    const created = toPatientRecordDto((await findPatientRow(trx, id))!)
    await writeAudit(trx, { userId: user.id, action: 'patient_created', entity: 'patient', entityId: id, after: created, ip })
    return created
  })
}

/**
 * One patient, with an audit row saying who opened the record and from where. A record merged into
 * another answers with the survivor's id instead.
 */
export async function openPatient(user: SessionUser, id: number, ip: string): Promise<PatientRecordDto | MergedPatientAnswer> {
  const db = useDb()
  const row = await findPatientRow(db, id)
  if (!row) throw notFound('No such patient.')
  if (row.merged_into_id) return { mergedInto: row.merged_into_id }
  await writeAudit(db, { userId: user.id, action: 'patient_opened', entity: 'patient', entityId: row.id, ip })
  return toPatientRecordDto(row)
}

/** The fields whose value differs, with the old and the new value. */
function changedFields(before: PatientRecordDto, after: PatientRecordDto): { before: Record<string, unknown>; after: Record<string, unknown> } {
  const old: Record<string, unknown> = {}
  const now: Record<string, unknown> = {}
  for (const key of Object.keys(after) as (keyof PatientRecordDto)[]) {
    if (key === 'rowVersion') continue
    if (JSON.stringify(before[key]) !== JSON.stringify(after[key])) { old[key] = before[key]; now[key] = after[key] }
  }
  return { before: old, after: now }
}

/** Saves an edit made on `rowVersion`; 409 when someone saved in between or the record was merged away. */
export function editPatient(user: SessionUser, id: number, input: PatientEditInput, ip: string): Promise<PatientRecordDto> {
  return inTransaction(async (trx) => {
    const row = await findPatientRow(trx, id, true)
    if (!row) throw notFound('No such patient.')
    if (row.merged_into_id) throw conflict(`This record was merged into patient ${row.merged_into_id}; edit that one.`, { field: 'id', mergedInto: row.merged_into_id })
    if (row.row_version !== input.rowVersion) throw conflict(STALE, { field: 'rowVersion', currentVersion: row.row_version })
    if (input.preferredSiteId !== row.preferred_site_id) await assertPreferredSite(trx, user, input.preferredSiteId)
    const saved = await updatePatientIfVersion(trx, id, input.rowVersion, { ...patientColumns(input), ...consentColumns(row, input, 'desk') })
    if (!saved) throw conflict(STALE, { field: 'rowVersion' })
    const before = toPatientRecordDto(row)
    const after = toPatientRecordDto((await findPatientRow(trx, id))!)
    const changes = changedFields(before, after)
    await writeAudit(trx, { userId: user.id, action: 'patient_changed', entity: 'patient', entityId: id, before: changes.before, after: changes.after, ip })
    return after
  })
}

/** Likely duplicates of a person being registered or edited (`exceptId`: the record itself). */
export async function checkDuplicates(input: DuplicateCheckInput): Promise<DuplicateCandidateDto[]> {
  const person: PatientIdentity = { ...input, email: input.email ?? null, phone: input.phone ?? null }
  const candidates = (await duplicateCandidates(useDb(), [person])).filter((candidate) => candidate.id !== input.exceptId)
  return findDuplicates(person, candidates).slice(0, 10).map((match) => ({ patient: match.candidate, reasons: match.reasons }))
}

function recordToFields(record: PatientRecordDto): PatientFieldsInput {
  return {
    firstName: record.firstName, lastName: record.lastName, preferredName: record.preferredName, dateOfBirth: record.dateOfBirth,
    email: record.email, phone: record.phone, addressStreet: record.addressStreet, addressCity: record.addressCity,
    addressRegion: record.addressRegion, addressPostalCode: record.addressPostalCode, preferredSiteId: record.preferredSiteId,
    emailConsent: record.emailConsent, emailConsentSource: record.emailConsentSource, smsConsent: record.smsConsent,
    smsConsentSource: record.smsConsentSource, guardianName: record.guardianName, guardianEmail: record.guardianEmail,
    guardianPhone: record.guardianPhone, frontDeskNote: record.frontDeskNote, alertText: record.alertText,
  }
}

/**
 * Merges `mergedId` into `survivorId` in one transaction: the chosen values, every visit (and with
 * them their outbox rows), the audit trail; a merge record keeps both records as they were. Refused
 * (409) when the two have visits at the same time, naming them.
 */
export function mergePatients(user: SessionUser, input: PatientMergeInput, ip: string): Promise<PatientMergeResult> {
  return inTransaction(async (trx) => {
    const [firstId, secondId] = [input.survivorId, input.mergedId].sort((a, b) => a - b)
    const rows = new Map<number, PatientRecordRow>()
    for (const id of [firstId!, secondId!]) {
      const row = await findPatientRow(trx, id, true)
      if (!row) throw badRequest(id === input.survivorId ? 'survivorId' : 'mergedId', 'is not a patient')
      if (row.merged_into_id) throw conflict(`Patient ${id} was already merged into patient ${row.merged_into_id}.`, { field: id === input.survivorId ? 'survivorId' : 'mergedId', mergedInto: row.merged_into_id })
      rows.set(id, row)
    }
    const survivorRow = rows.get(input.survivorId)!
    const mergedRow = rows.get(input.mergedId)!
    const overlaps = await overlappingVisits(trx, input.survivorId, input.mergedId)
    if (overlaps.length) {
      const named = overlaps.map((overlap) => `visit ${overlap.survivor_visit_id} and visit ${overlap.merged_visit_id} (${formatDateTime(overlap.start_utc, { timeZone: overlap.time_zone, clock: overlap.clock, dateOrder: overlap.date_order }, 'short')}, ${overlap.site_name})`)
      throw conflict(`These two records have visits at the same time: ${named.join('; ')}. Cancel or move one of each pair first.`, {
        field: 'mergedId', visitIds: overlaps.flatMap((overlap) => [overlap.survivor_visit_id, overlap.merged_visit_id]),
      })
    }
    const survivor = toPatientRecordDto(survivorRow)
    const merged = toPatientRecordDto(mergedRow)
    const fields = recordToFields(survivor)
    const mergedFields = recordToFields(merged)
    const fromMerged = MERGE_FIELDS.filter((field) => input.take[field] === 'merged' && field !== 'emailConsent' && field !== 'smsConsent')
    for (const field of fromMerged) (fields as Record<string, unknown>)[field] = mergedFields[field]
    await assertPreferredSite(trx, user, fromMerged.includes('preferredSiteId') ? fields.preferredSiteId : null)
    // Consent follows the contact kept (shared/domain/merge-consent.ts): never consent given for
    // another address or number. Its date and source come with it; none kept clears both.
    const consent: Record<string, unknown> = {}
    for (const channel of ['email', 'sms'] as const) {
      const kept = mergedConsent(channel, survivor, merged, input.take)
      const row = kept.from === 'merged' ? mergedRow : survivorRow
      if (channel === 'email') {
        fields.emailConsent = kept.consent
        Object.assign(consent, kept.from === 'none'
          ? { email_consent: false, email_consent_at: null, email_consent_source: null }
          : { email_consent: kept.consent, email_consent_at: row.email_consent_at, email_consent_source: row.email_consent_source })
      } else {
        fields.smsConsent = kept.consent
        Object.assign(consent, kept.from === 'none'
          ? { sms_consent: false, sms_consent_at: null, sms_consent_source: null }
          : { sms_consent: kept.consent, sms_consent_at: row.sms_consent_at, sms_consent_source: row.sms_consent_source })
      }
    }
    await updatePatientIfVersion(trx, input.survivorId, survivorRow.row_version, { ...patientColumns(fields), ...consent })
    const moved = await moveVisits(trx, input.mergedId, input.survivorId)
    const auditRows = await moveAuditTrail(trx, input.mergedId, input.survivorId)
    const followed = await moveRecallAndWaitlist(trx, input.mergedId, input.survivorId)
    await markMerged(trx, input.mergedId, input.survivorId)
    const mergeId = await insertMerge(trx, {
      survivorId: input.survivorId, mergedId: input.mergedId, userId: user.id, choices: input.take,
      mergedBefore: merged, survivorBefore: survivor, moved: { ...moved, auditRows, ...followed },
    })
    const after = toPatientRecordDto((await findPatientRow(trx, input.survivorId))!)
    await writeAudit(trx, {
      userId: user.id, action: 'patient_merged', entity: 'patient', entityId: input.survivorId,
      before: { survivor, merged }, after: { ...changedFields(survivor, after).after, mergedId: input.mergedId, movedVisitIds: moved.visitIds }, ip,
    })
    return { survivor: after, movedVisitIds: moved.visitIds, mergeId }
  })
}
