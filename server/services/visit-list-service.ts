// Visits for the Chairboard, My day and week views.
import type { SessionUser } from '#shared/types/auth'
import type { BoardVisitDto } from '#shared/types/visits'
import type { PlanItemSummary } from '#shared/types/chair-time'
import { DATE_BOUNDS } from '#shared/domain/input-bounds'
import { useDb } from '../utils/db'
import { requireSiteAccess } from '../utils/auth'
import { groupSegments, listVisits, toVisitDto, type BoardRow, type VisitListFilter } from '../repositories/visits'

/** The repository's filter without the caller's site scope, which comes from the session. */
export type VisitListRequest = Omit<VisitListFilter, 'siteIds'>

function initials(name: string): string {
  return name.replace(/^Dr\.\s*/, '').split(/\s+/).map((part) => part[0] ?? '').join('').slice(0, 3).toUpperCase()
}

/** "Posterior composite 19 MO" (Universal) or "… 36 MO" (ISO 3950), in the visit's site's notation. */
function procedureLine(item: PlanItemSummary, notation: 'universal' | 'iso'): string {
  const tooth = item.tooth ? ` ${notation === 'iso' ? item.tooth.iso : item.tooth.universal}` : ''
  const surfaces = item.surfaces?.length ? ` ${item.surfaces.join('')}` : ''
  return `${item.templateName}${tooth}${surfaces}`
}

export function toBoardVisit(row: BoardRow, segments: Parameters<typeof toVisitDto>[1]): BoardVisitDto {
  const visit = toVisitDto(row, segments)
  return {
    ...visit,
    patientName: `${row.patient_first_name} ${row.patient_last_name}`,
    patientPhone: row.patient_phone,
    patientAlert: row.patient_alert,
    providerName: row.provider_name,
    providerInitials: initials(row.provider_name),
    procedures: (visit.plan.items ?? []).map((item) => procedureLine(item, row.site_tooth_notation)),
    strandedReason: row.stranded_reason ?? null,
  }
}

export async function visitsFor(request: VisitListRequest, user: SessionUser): Promise<BoardVisitDto[]> {
  if (request.siteId !== undefined) requireSiteAccess(user, request.siteId)
  const { rows, segments } = await listVisits(useDb(), {
    ...request, siteIds: user.allSites ? 'all' : user.siteIds,
  })
  const bySegment = groupSegments(segments)
  return rows.map((row) => toBoardVisit(row, bySegment.get(row.id) ?? []))
}

/** A patient's visits from the earliest date the app keeps to the furthest it books, cancelled ones included. */
export function patientHistory(patientId: number, user: SessionUser): Promise<BoardVisitDto[]> {
  const { earliest, yearsAhead } = DATE_BOUNDS
  return visitsFor({ patientId, fromMs: Date.parse(`${earliest}T00:00:00Z`), toMs: Date.now() + (yearsAhead + 1) * 366 * 86_400_000, includeCancelled: true }, user)
}
