// Stranded visits (issue 13): the open visits ahead a change is checked against, the flag on them,
// and the Rebook list that reads it.
import type { Db } from '../utils/db'
import type { VisitPlan } from '#shared/types/chair-time'
import type { EpochInterval } from '#shared/types/rota'
import type { RebookEntry, RebookItem } from '#shared/types/rebook'
import { ROLE_GROUPS } from '#shared/utils/access'
import { localIsoAt } from '#shared/utils/local-date'
import { parseJson } from './json'

/** Visits still to come that hold time: what a change can strand. */
const OPEN_AHEAD = ['booked', 'confirmed'] as const

export interface OpenVisit {
  id: number
  siteId: number
  operatoryId: number
  providerId: number
  patientName: string
  startMs: number
  endMs: number
  templateCodes: string[]
  handsOn: EpochInterval[]
  strandedReason: string | null
}

export interface OpenVisitScope {
  siteIds?: readonly number[]
  providerId?: number
  /** Visits with this template among their procedures. */
  templateCode?: string
  visitIds?: readonly number[]
}

interface OpenVisitRow {
  id: number
  site_id: number
  operatory_id: number
  provider_id: number
  first_name: string
  last_name: string
  start_utc: Date
  end_utc: Date
  plan: string
  stranded_reason: string | null
}

/** Booked and confirmed visits starting after `fromMs` within the scope, with their hands-on parts. */
export async function listOpenVisitsAhead(db: Db, scope: OpenVisitScope, fromMs: number): Promise<OpenVisit[]> {
  const query = db('visits').join('patients', 'patients.id', 'visits.patient_id')
    .whereIn('visits.state', [...OPEN_AHEAD]).where('visits.start_utc', '>', new Date(fromMs))
    .orderBy(['visits.start_utc', 'visits.id'])
    .select('visits.id', 'visits.site_id', 'visits.operatory_id', 'visits.provider_id', 'patients.first_name', 'patients.last_name',
      'visits.start_utc', 'visits.end_utc', 'visits.plan', 'visits.stranded_reason')
  if (scope.siteIds) query.whereIn('visits.site_id', [...scope.siteIds])
  if (scope.providerId !== undefined) query.where('visits.provider_id', scope.providerId)
  if (scope.visitIds) query.whereIn('visits.id', [...scope.visitIds])
  if (scope.templateCode !== undefined) query.where('visits.plan', 'like', `%"templateCode":${JSON.stringify(scope.templateCode).replace(/[\\%_]/g, '\\$&')}%`)
  const rows = (await query) as OpenVisitRow[]
  if (rows.length === 0) return []
  const segments: Array<{ visit_id: number; start_utc: Date; end_utc: Date }> = await db('visit_segments')
    .whereIn('visit_id', rows.map((row) => row.id)).where({ kind: 'hands_on' }).select('visit_id', 'start_utc', 'end_utc')
  return rows.map((row) => ({
    id: row.id, siteId: row.site_id, operatoryId: row.operatory_id, providerId: row.provider_id,
    patientName: `${row.first_name} ${row.last_name}`, startMs: row.start_utc.getTime(), endMs: row.end_utc.getTime(),
    templateCodes: (parseJson<VisitPlan>(row.plan, {} as VisitPlan).items ?? []).map((item) => item.templateCode),
    handsOn: segments.filter((segment) => segment.visit_id === row.id).map((segment) => ({ startMs: segment.start_utc.getTime(), endMs: segment.end_utc.getTime() })),
    strandedReason: row.stranded_reason,
  }))
}

export interface ProviderState {
  id: number
  name: string
  kind: string
  capabilities: string[]
  /** The provider row and the staff account both active. */
  active: boolean
}

export async function findProviderStates(db: Db, ids: readonly number[]): Promise<ProviderState[]> {
  if (ids.length === 0) return []
  const rows = await db('providers').join('users', 'users.id', 'providers.user_id').whereIn('providers.id', [...ids])
    .select('providers.id', 'users.name', 'users.role', 'users.active as user_active', 'providers.capabilities', 'providers.active')
  return rows.map((row: { id: number; name: string; role: string; user_active: number; capabilities: unknown; active: number }) => ({
    id: row.id, name: row.name, kind: row.role, capabilities: parseJson<string[]>(row.capabilities, []),
    active: Boolean(row.active) && Boolean(row.user_active) && (ROLE_GROUPS.providers as readonly string[]).includes(row.role),
  }))
}

/** The current version's name, capability and category of each template code. */
export async function findTemplateNeeds(db: Db, codes: readonly string[]): Promise<Map<string, { name: string; capability: string; category: string }>> {
  if (codes.length === 0) return new Map()
  const rows = await db('procedure_templates').whereIn('code', [...new Set(codes)]).where('is_current', true).select('code', 'name', 'capability', 'category')
  return new Map(rows.map((row: { code: string; name: string; capability: string; category: string }) => [row.code, { name: row.name, capability: row.capability, category: row.category }]))
}

/**
 * Locks the given sites' rows (every site when none given) for a change whose effect the booking
 * transaction cannot see through a rota trigger: bookings read the site row in share mode, so they
 * wait for this change, and this change waits for bookings in flight.
 */
export async function lockSites(db: Db, siteIds?: readonly number[]): Promise<void> {
  const query = db('sites').orderBy('id').forUpdate().select('id')
  if (siteIds) query.whereIn('id', [...siteIds])
  await query
}

/** Flags visits not flagged yet; returns how many it flagged. */
export async function markStranded(db: Db, visitId: number, reason: string): Promise<boolean> {
  const updated = await db('visits').where({ id: visitId }).whereNull('stranded_reason')
    .update({ stranded_reason: reason.slice(0, 300), stranded_at: db.fn.now(3), row_version: db.raw('row_version + 1'), updated_at: db.fn.now(3) })
  return updated === 1
}

/** Clears a visit's flag; returns whether it had one. */
export async function clearStranded(db: Db, visitId: number): Promise<boolean> {
  const updated = await db('visits').where({ id: visitId }).whereNotNull('stranded_reason').update({ stranded_reason: null, stranded_at: null })
  return updated === 1
}

/** The visit's procedures as the openings search takes them, teeth in Universal numbering. */
function itemsOf(plan: string): RebookItem[] {
  return (parseJson<VisitPlan>(plan, {} as VisitPlan).items ?? []).map((item) => ({
    templateCode: item.templateCode, notation: 'universal' as const,
    ...(item.tooth ? { tooth: item.tooth.universal } : {}),
    ...(item.extraTeeth?.length ? { teeth: item.extraTeeth.map((tooth) => tooth.universal) } : {}),
    ...(item.surfaces?.length ? { surfaces: item.surfaces.join('') } : {}),
  }))
}

interface RebookRow {
  id: number
  site_id: number
  operatory_id: number
  provider_id: number
  patient_id: number
  first_name: string
  last_name: string
  phone: string | null
  email: string | null
  start_utc: Date
  end_utc: Date
  stranded_reason: string
  stranded_at: Date
  row_version: number
  provider_name: string
  operatory_name: string
  time_zone: string
  tooth_notation: string
  plan: string
}

/** The sites' open stranded visits, earliest first. */
export async function listRebook(db: Db, siteIds: readonly number[]): Promise<RebookEntry[]> {
  const rows = (await db('visits')
    .join('patients', 'patients.id', 'visits.patient_id')
    .join('providers', 'providers.id', 'visits.provider_id')
    .join('users', 'users.id', 'providers.user_id')
    .join('operatories', 'operatories.id', 'visits.operatory_id')
    .join('sites', 'sites.id', 'visits.site_id')
    .whereIn('visits.site_id', [...siteIds]).whereNotNull('visits.stranded_reason')
    .whereIn('visits.state', [...OPEN_AHEAD])
    .orderBy(['visits.start_utc', 'visits.id'])
    .select('visits.id', 'visits.site_id', 'visits.operatory_id', 'visits.provider_id', 'visits.patient_id', 'patients.first_name', 'patients.last_name',
      'patients.phone', 'patients.email', 'visits.start_utc', 'visits.end_utc', 'visits.stranded_reason', 'visits.stranded_at', 'visits.row_version',
      'users.name as provider_name', 'operatories.name as operatory_name', 'sites.time_zone', 'sites.tooth_notation', 'visits.plan')) as RebookRow[]
  return rows.map((row) => ({
    id: row.id, siteId: row.site_id, operatoryId: row.operatory_id, providerId: row.provider_id, patientId: row.patient_id,
    patient: `${row.first_name} ${row.last_name}`, phone: row.phone, email: row.email,
    startUtc: row.start_utc.toISOString(), endUtc: row.end_utc.toISOString(), startLocalIso: localIsoAt(row.start_utc.getTime(), row.time_zone),
    reason: row.stranded_reason, strandedAt: row.stranded_at.toISOString(), rowVersion: row.row_version,
    providerName: row.provider_name, operatoryName: row.operatory_name, timeZone: row.time_zone,
    items: itemsOf(row.plan),
    // As the board says them: "Posterior composite 19 MO", teeth in the site's notation.
    procedures: (parseJson<VisitPlan>(row.plan, {} as VisitPlan).items ?? []).map((item) =>
      [item.templateName, item.tooth ? item.tooth[row.tooth_notation === 'iso' ? 'iso' : 'universal'] : '', item.surfaces?.join('') ?? ''].filter(Boolean).join(' ')),
  }))
}
