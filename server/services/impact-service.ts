// Impact before saving (issue 13 §1): any change that can strand booked visits (a shift, time off or
// an extra day, a block, a site's hours or closed dates, a room, a provider, a template) runs through
// `changeWithImpact`. In one transaction it checks the open visits ahead in the change's scope, makes
// the change, checks them again with the same rules the booking transaction uses
// (shared/domain/stranding.ts), and either rolls everything back (`dryRun`) or flags the visits the
// change strands, with an audit row each, before committing.
//
// Races: the change writes the rows a booking reads under lock (a rota trigger or a site change writes
// the site row, which bookings read in share mode; rooms and providers are the rows bookings lock by
// writing; template changes lock every site row first). A booking that committed before the change's
// write is seen by the second check and flagged if it no longer holds; a booking after it waits for
// the change to commit and is then refused by its own checks.
import type { StrandedVisitDto } from '#shared/types/rebook'
import { strandReason } from '#shared/domain/stranding'
import { localIsoAt } from '#shared/utils/local-date'
import type { Db } from '../utils/db'
import { inTransaction } from '../utils/db-retry'
import { scheduleNowMs } from '../utils/clock'
import { loadSiteCalendar, type SiteCalendarInputs } from '../repositories/site-calendar'
import { writeAudit } from '../repositories/audit-log'
import {
  clearStranded, findProviderStates, findTemplateNeeds, listOpenVisitsAhead, markStranded,
  type OpenVisit, type OpenVisitScope,
} from '../repositories/stranded'

interface Verdict {
  visit: OpenVisit
  reason: string
  zone: string
}

interface Check {
  /** The visits in scope that do not hold, with the reason. */
  notHolding: Map<number, Verdict>
  /** The visits in scope flagged as stranded already. */
  flagged: number[]
}

/** The visits in scope that do not hold on the calendar as this transaction sees it now. */
async function checkVisits(trx: Db, scope: OpenVisitScope, nowMs: number): Promise<Check> {
  const visits = await listOpenVisitsAhead(trx, scope, nowMs)
  const found = new Map<number, Verdict>()
  const flagged = visits.filter((visit) => visit.strandedReason !== null).map((visit) => visit.id)
  if (visits.length === 0) return { notHolding: found, flagged }
  const calendars = new Map<number, SiteCalendarInputs | undefined>()
  for (const siteId of new Set(visits.map((visit) => visit.siteId))) calendars.set(siteId, await loadSiteCalendar(trx, siteId))
  const providers = await findProviderStates(trx, [...new Set(visits.map((visit) => visit.providerId))])
  const needs = await findTemplateNeeds(trx, visits.flatMap((visit) => visit.templateCodes))
  for (const visit of visits) {
    const calendar = calendars.get(visit.siteId)
    if (!calendar) continue
    const reason = strandReason({
      calendar,
      room: calendar.operatoryDetails.find((room) => room.id === visit.operatoryId),
      provider: providers.find((provider) => provider.id === visit.providerId),
      needs: visit.templateCodes.flatMap((code) => needs.get(code) ?? []),
      startMs: visit.startMs, endMs: visit.endMs, handsOn: visit.handsOn,
    })
    if (reason !== null) found.set(visit.id, { visit, reason, zone: calendar.site.timeZone })
  }
  return { notHolding: found, flagged }
}

function toDto(verdict: Verdict): StrandedVisitDto {
  const { visit } = verdict
  return { id: visit.id, patient: visit.patientName, startLocalIso: localIsoAt(visit.startMs, verdict.zone), siteId: visit.siteId, reason: verdict.reason }
}

/** Handed to a change: call `watch` with the change's scope before writing anything. */
export interface ImpactWatch {
  watch(scope: OpenVisitScope): Promise<void>
}

/** Thrown to roll a dry run back; carries its answer out of the transaction. */
class DryRunAnswer extends Error {
  constructor(readonly strandedVisits: StrandedVisitDto[]) {
    super('dry run')
  }
}

export interface ChangeContext {
  userId: number
  /** Preview only: everything is rolled back. */
  dryRun: boolean
  /** What the audit rows of the flagged visits name as the cause, e.g. 'time off'. */
  cause: string
}

export type ImpactResult<T> = { dryRun: true; strandedVisits: StrandedVisitDto[] } | { dryRun: false; saved: T; strandedVisits: StrandedVisitDto[] }

/**
 * Runs `work` (the change, which calls `impact.watch(scope)` before its first write) in one
 * transaction and answers the visits it strands. A dry run writes nothing; a save flags them.
 */
export async function changeWithImpact<T>(context: ChangeContext, work: (trx: Db, impact: ImpactWatch) => Promise<T>): Promise<ImpactResult<T>> {
  try {
    return await inTransaction(async (trx) => {
      const nowMs = scheduleNowMs()
      const watched: Array<{ scope: OpenVisitScope; before: Map<number, Verdict> }> = []
      const impact: ImpactWatch = {
        async watch(scope) {
          watched.push({ scope, before: (await checkVisits(trx, scope, nowMs)).notHolding })
        },
      }
      const saved = await work(trx, impact)
      const stranded = new Map<number, Verdict>()
      const holdAgain = new Set<number>()
      for (const { scope, before } of watched) {
        const after = await checkVisits(trx, scope, nowMs)
        for (const [id, verdict] of after.notHolding) {
          if (!before.has(id)) stranded.set(id, verdict)
        }
        // Flagged visits the change makes hold again (time off withdrawn, a block removed) leave the list.
        for (const id of after.flagged) if (!after.notHolding.has(id)) holdAgain.add(id)
      }
      const strandedVisits = [...stranded.values()].sort((a, b) => a.visit.startMs - b.visit.startMs || a.visit.id - b.visit.id).map(toDto)
      if (context.dryRun) throw new DryRunAnswer(strandedVisits)
      for (const visit of strandedVisits) {
        if (await markStranded(trx, visit.id, visit.reason)) {
          await writeAudit(trx, { userId: context.userId, action: 'visit_stranded', entity: 'visit', entityId: visit.id, after: { reason: visit.reason, cause: context.cause } })
        }
      }
      for (const id of holdAgain) await dropStranded(trx, id, context.userId, `holds again: ${context.cause}`)
      return { dryRun: false as const, saved, strandedVisits }
    })
  } catch (error) {
    if (error instanceof DryRunAnswer) return { dryRun: true, strandedVisits: error.strandedVisits }
    throw error
  }
}

/**
 * After a stranded visit was moved (inside the move's transaction): the flag clears when the visit
 * now holds, or carries the reason it still does not.
 */
export async function settleStranded(trx: Db, visitId: number, userId: number | null): Promise<void> {
  const verdict = (await checkVisits(trx, { visitIds: [visitId] }, scheduleNowMs())).notHolding.get(visitId)
  if (verdict) return
  if (await clearStranded(trx, visitId)) {
    await writeAudit(trx, { userId, action: 'visit_unstranded', entity: 'visit', entityId: visitId, after: { how: 'moved' } })
  }
}

/** A cancelled (or otherwise closed) visit leaves the Rebook list. */
export async function dropStranded(trx: Db, visitId: number, userId: number, how: string): Promise<void> {
  if (await clearStranded(trx, visitId)) {
    await writeAudit(trx, { userId, action: 'visit_unstranded', entity: 'visit', entityId: visitId, after: { how } })
  }
}
