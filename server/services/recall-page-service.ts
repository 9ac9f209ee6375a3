// The patient's recall page (issue 17 §1): the recall e-mail links to `/recall/<token>`, which lists up
// to RECALL_PAGE_OPENINGS times (at least RECALL_PAGE_SPACING_MINUTES apart) for the recall's plan at the
// patient's preferred site (the site that mailed them when they have none). The patient picks one and it is booked through the booking
// transaction (`bookInTransaction`, which also marks the recall booked and closes matching waitlist
// entries), with an audit row `recall_booked` on entity `recall`. When the time was taken in between,
// the answer is a 409 "that time has just gone" carrying fresh openings. Bad or edited links are 404,
// expired ones 410.
import type { PublicRecallDto, RecallOpeningDto } from '#shared/types/recall-page'
import type { RecallBookInput } from '#shared/schemas/recall'
import type { OpeningsRequest } from '#shared/schemas/visits'
import type { SiteDetail } from '#shared/types/sites'
import { RECALL_PAGE_OPENINGS, RECALL_PAGE_SEARCH_DAYS, RECALL_PAGE_SPACING_MINUTES, RECALL_TEMPLATE_CATEGORY, spreadOpenings } from '#shared/domain/recall'
import { patientMinutesOf } from '#shared/domain/patient-time'
import { addDays, todayIn } from '#shared/utils/local-date'
import { useDb, type Db } from '../utils/db'
import { conflict, notFound } from '../utils/errors'
import { inTransaction } from '../utils/db-retry'
import { scheduleNowMs } from '../utils/clock'
import { useVisitLinkSecret } from '../utils/visit-link-secret'
import { readRecallToken, recallSignatureValid } from '../utils/recall-token'
import { findSiteDetail } from '../repositories/sites'
import { listCurrentTemplates } from '../repositories/templates'
import { findRecallForPage, recentFinishedTemplateCodes } from '../repositories/recalls'
import { findVisitRow } from '../repositories/visits'
import { writeAudit } from '../repositories/audit-log'
import { bookInTransaction } from './booking-service'
import { openingsAtSite } from './openings-service'

const LINK_NOT_VALID = 'This link is not valid. Please call the practice.'
const LINK_EXPIRED = 'This link has expired. Please call the practice, or use the link in our next e-mail.'
const JUST_GONE = 'Sorry, that time has just gone. Here are the times that are still free.'
const ALREADY_BOOKED = 'A visit for this is already booked. To change it, use the link in its confirmation e-mail or call the practice.'

type PageRecall = NonNullable<Awaited<ReturnType<typeof findRecallForPage>>>

function gone(message: string) {
  return createError({ statusCode: 410, statusMessage: 'Gone', message })
}

/** The recall and site a token opens: 404 when malformed, unknown, edited or out of date; 410 expired. */
async function recallOfToken(db: Db, token: string): Promise<{ recall: PageRecall; site: SiteDetail }> {
  const parts = readRecallToken(token)
  if (!parts) throw notFound(LINK_NOT_VALID)
  const recall = await findRecallForPage(db, parts.recallId)
  if (!recall || recall.mergedIntoId !== null || !recallSignatureValid(useVisitLinkSecret(), token, { patientId: recall.patientId, dueDate: recall.dueDate })) throw notFound(LINK_NOT_VALID)
  if (parts.expiresAtMs <= scheduleNowMs()) throw gone(LINK_EXPIRED)
  const site = await findSiteDetail(db, parts.siteId)
  if (!site || !site.active) throw notFound(LINK_NOT_VALID)
  return { recall, site }
}

/**
 * The plan of a recall: the procedure of that kind the patient last had (their latest finished visit
 * with a template of the kind's category still in use), else the first template in use of that category.
 * Balance's recall suggestions use the same plan.
 */
export async function recallPlanOf(db: Db, recall: Pick<PageRecall, 'patientId' | 'kind'>): Promise<{ items: Array<{ templateCode: string }>; what: string } | null> {
  const category = RECALL_TEMPLATE_CATEGORY[recall.kind]
  const inUse = (await listCurrentTemplates(db)).filter((entry) => entry.category === category)
  const lastHad = (await recentFinishedTemplateCodes(db, recall.patientId)).map((code) => inUse.find((entry) => entry.code === code)).find(Boolean)
  const template = lastHad ?? inUse[0]
  return template ? { items: [{ templateCode: template.code }], what: template.name } : null
}

async function openingsFor(db: Db, site: SiteDetail, items: Array<{ templateCode: string }>) {
  const today = todayIn(site.timeZone, scheduleNowMs())
  const request: OpeningsRequest = {
    // Enough starts (every chair, every 5 minutes) to pick six a couple of hours apart.
    items, from: today, to: addDays(today, RECALL_PAGE_SEARCH_DAYS), partOfDay: 'any', limit: 500, fewestGaps: false, wholeGroup: false,
  }
  const { plan, openings } = await openingsAtSite(db, site, request)
  const chairMinutes = plan.chairMinutes
  return {
    minutes: patientMinutesOf(plan, chairMinutes),
    openings: spreadOpenings(openings, RECALL_PAGE_OPENINGS, RECALL_PAGE_SPACING_MINUTES).map((opening): RecallOpeningDto => ({ startUtc: opening.startUtc, startLocalIso: opening.startLocalIso, operatoryId: opening.operatoryId, providerId: opening.providerId })),
  }
}

async function pageOf(db: Db, recall: PageRecall, site: SiteDetail): Promise<PublicRecallDto> {
  const base = {
    siteName: site.name, sitePhone: site.phone || null, siteAddress: site.address || null, timeZone: site.timeZone, clock: site.clock, dateOrder: site.dateOrder,
    firstName: recall.firstName, kind: recall.kind, dueDate: recall.dueDate,
  }
  if (recall.bookedVisitLive && recall.bookedVisitId !== null) {
    const visit = await findVisitRow(db, recall.bookedVisitId)
    return { ...base, what: '', minutes: 0, state: 'booked', bookedStartUtc: visit ? visit.start_utc.toISOString() : null, openings: [] }
  }
  const plan = await recallPlanOf(db, recall)
  if (!plan) return { ...base, what: '', minutes: 0, state: 'open', bookedStartUtc: null, openings: [] }
  const found = await openingsFor(db, site, plan.items)
  return { ...base, what: plan.what, minutes: found.minutes, state: 'open', bookedStartUtc: null, openings: found.openings }
}

export async function publicRecall(token: string): Promise<PublicRecallDto> {
  const db = useDb()
  const { recall, site } = await recallOfToken(db, token)
  return pageOf(db, recall, site)
}

function statusOf(error: unknown): number | undefined {
  return (error as { statusCode?: number })?.statusCode
}

/** The patient picks a time: booked (201), or 409 "just gone" with fresh openings, or 409 already booked. */
export async function bookFromRecall(token: string, input: RecallBookInput): Promise<PublicRecallDto> {
  const db = useDb()
  const { recall, site } = await recallOfToken(db, token)
  if (recall.bookedVisitLive) throw conflict(ALREADY_BOOKED, { field: 'recall' })
  const plan = await recallPlanOf(db, recall)
  if (!plan) throw conflict('No procedure for this recall can be booked online at the moment. Please call the practice.', { field: 'recall' })
  try {
    await inTransaction(async (trx) => {
      // Write the recall row first (a lock that also holds on the cluster): two presses of the page at
      // once give one visit, the second finds the recall booked.
      await trx('recalls').where({ id: recall.id }).update({ updated_at: new Date() })
      const now = await findRecallForPage(trx, recall.id)
      if (!now || now.dueDate !== recall.dueDate) throw notFound(LINK_NOT_VALID)
      if (now.bookedVisitLive) throw conflict(ALREADY_BOOKED, { field: 'recall' })
      const visit = await bookInTransaction(trx, {
        patientId: recall.patientId, siteId: site.id, operatoryId: input.operatoryId, providerId: input.providerId,
        startUtc: input.startUtc, items: plan.items, note: 'Booked by the patient from a recall e-mail',
      }, null)
      await writeAudit(trx, {
        userId: null, action: 'recall_booked', entity: 'recall', entityId: recall.id,
        after: { visitId: visit.id, patientId: recall.patientId, kind: recall.kind, dueDate: recall.dueDate, siteId: site.id, startUtc: visit.startUtc },
      })
    })
  } catch (error) {
    if (statusOf(error) !== 409 || (error as { data?: { field?: string } }).data?.field === 'recall') throw error
    // Someone else took the time (or it no longer fits the rota): fresh times, in the same answer.
    const fresh = await openingsFor(db, site, plan.items)
    throw conflict(JUST_GONE, { field: 'startUtc', openings: fresh.openings })
  }
  return pageOf(db, (await findRecallForPage(db, recall.id))!, site)
}
