// Spreadsheets out (issue 16 §3): patients (all, or those a search finds) and a site's visits over
// local dates, as CSV with a header row. Cells are escaped against formula injection (shared/utils/csv.ts).
// Dates and times are written as the site shows them (its date order and clock, through the one
// formatter shared/utils/display-time.ts): the visits' site, or for patients the site the export is for
// (`siteId`; without one the default style, month/day/year).
import type { SessionUser } from '#shared/types/auth'
import type { VisitsExportQuery } from '#shared/schemas/exports'
import { toCsv } from '#shared/utils/csv'
import { formatPhone } from '#shared/domain/phone'
import { localDateAt, localDayRange } from '#shared/utils/local-date'
import { DEFAULT_DISPLAY, formatDate, formatLocalDate, formatTime } from '#shared/utils/display-time'
import type { DisplayStyle } from '#shared/types/display'
import { requireSiteAccess } from '../utils/auth'
import { useDb } from '../utils/db'
import { notFound } from '../utils/errors'
import { allPatientRecords } from '../repositories/patients'
import { listVisits } from '../repositories/visits'
import { listOperatories } from '../repositories/operatories'
import { findSite, listSites } from '../repositories/sites'
import { writeAudit } from '../repositories/audit-log'
import { toBoardVisit } from './visit-list-service'
import { balanceAcrossSites } from './balance-service'
import type { BalanceQuery } from '#shared/schemas/balance'

const PATIENT_HEADER = ['Patient id', 'Given name', 'Family name', 'Preferred name', 'Birth date', 'E-mail', 'Mobile phone', 'Street', 'Town or city',
  'State or region', 'Postal code', 'E-mail consent', 'E-mail consent since', 'Text consent', 'Text consent since', 'Guardian', 'Guardian e-mail',
  'Guardian phone', 'Front desk note', 'Alert']

export async function exportPatients(user: SessionUser, search: string | undefined, ip: string, siteId?: number): Promise<string> {
  const db = useDb()
  let style: DisplayStyle = { ...DEFAULT_DISPLAY, timeZone: 'UTC' }
  if (siteId !== undefined) {
    requireSiteAccess(user, siteId)
    const site = await findSite(db, siteId)
    if (!site) throw notFound('No such site.')
    style = { timeZone: site.timeZone, clock: site.clock, dateOrder: site.dateOrder }
  }
  const birthDate = (date: string | null) => (date && /^\d{4}-\d{2}-\d{2}$/.test(date) ? formatLocalDate(date, style, 'numeric') : date)
  const since = (instant: string | null) => (instant ? formatDate(instant, style, 'numeric') : null)
  const records = await allPatientRecords(db, search)
  await writeAudit(db, { userId: user.id, action: 'patients_exported', entity: 'patient', entityId: null, after: { search: search ?? null, rows: records.length }, ip })
  const yesNo = (value: boolean) => (value ? 'yes' : 'no')
  return toCsv(PATIENT_HEADER, records.map((patient) => [
    patient.id, patient.firstName, patient.lastName, patient.preferredName, birthDate(patient.dateOfBirth), patient.email, formatPhone(patient.phone),
    patient.addressStreet, patient.addressCity, patient.addressRegion, patient.addressPostalCode, yesNo(patient.emailConsent),
    since(patient.emailConsentAt), yesNo(patient.smsConsent), since(patient.smsConsentAt), patient.guardianName,
    patient.guardianEmail, formatPhone(patient.guardianPhone), patient.frontDeskNote, patient.alertText,
  ]))
}

const VISIT_HEADER = ['Visit id', 'Date', 'Start', 'End', 'Chair', 'Provider', 'Patient id', 'Patient', 'Procedures', 'State', 'Cancel reason']

export async function exportVisits(user: SessionUser, query: VisitsExportQuery, ip: string): Promise<string> {
  requireSiteAccess(user, query.siteId)
  const db = useDb()
  const site = await findSite(db, query.siteId)
  if (!site) throw notFound('No such site.')
  const zone = site.timeZone
  const style: DisplayStyle = { timeZone: zone, clock: site.clock, dateOrder: site.dateOrder }
  const fromMs = Date.parse(localDayRange(query.from, zone).fromUtc)
  const toMs = Date.parse(localDayRange(query.to, zone).toUtc)
  const { rows, segments } = await listVisits(db, { siteIds: [query.siteId], siteId: query.siteId, fromMs, toMs, includeCancelled: true })
  const chairs = new Map((await listOperatories(db, query.siteId)).map((chair) => [chair.id, chair.name]))
  await writeAudit(db, { userId: user.id, action: 'visits_exported', entity: 'site', entityId: query.siteId, after: { from: query.from, to: query.to, rows: rows.length }, ip })
  return toCsv(VISIT_HEADER, rows.map((row) => {
    const visit = toBoardVisit(row, segments.filter((segment) => segment.visit_id === row.id))
    const startMs = Date.parse(visit.startUtc)
    return [visit.id, formatLocalDate(localDateAt(startMs, zone), style, 'numeric'), formatTime(visit.startUtc, style), formatTime(visit.endUtc, style), chairs.get(visit.operatoryId) ?? '',
      visit.providerName, visit.patientId, visit.patientName, visit.procedures.join('; '), visit.state, visit.cancelReason]
  }))
}

const BALANCE_HEADER = ['Site', 'Date', 'Chair open hours', 'Chair hours held', 'Chair use %', 'Band', 'Nobody on shift',
  'Did not come %', 'Cancelled late %', 'Freed hours', 'Freed time refilled %', 'Median hours to refill']

/**
 * The Balance figures (issue 17 §3): a row per site and day, then a row per site for the whole range
 * ("All days") with the visit outcomes and refilled time. Dates in the site's own date order; no
 * patient data, so no audit row.
 */
export async function exportBalance(user: SessionUser, query: BalanceQuery): Promise<string> {
  const balance = await balanceAcrossSites(user, query)
  const sites = new Map((await listSites(useDb(), user)).map((site) => [site.id, site]))
  const hours = (minutes: number) => (minutes / 60).toFixed(1)
  const percent = (share: number | null) => (share === null ? '' : String(Math.round(share * 100)))
  const rows = balance.sites.flatMap((site) => {
    const style = { dateOrder: sites.get(site.siteId)?.dateOrder ?? 'year-month-day' as const }
    return [
      ...site.days.map((day) => [site.siteName, formatLocalDate(day.date, style, 'numeric'), hours(day.availableMinutes), hours(day.usedMinutes), percent(day.share), day.band ?? '', day.nobodyOnShift ? 'yes' : 'no', '', '', '', '', '']),
      [site.siteName, 'All days', hours(site.chairs.availableMinutes), hours(site.chairs.usedMinutes), percent(site.chairs.share), site.chairs.band ?? '', '',
        percent(site.outcomes.missedRate), percent(site.outcomes.lateCancelRate), hours(site.refill.freedMinutes), percent(site.refill.refilledShare),
        site.refill.medianHoursToRefill === null ? '' : site.refill.medianHoursToRefill.toFixed(1)],
    ]
  })
  return toCsv(BALANCE_HEADER, rows)
}
