// Why nothing fits, in front-desk words, and the nearest near misses.
//
// Reasons come from relaxing the rules one at a time, firmest first: equipment, a provider on
// shift at all, opening hours, notice, part of day, other visits in the chair, the provider's
// shift at those times, the provider's other patients. The first rule that empties the list is
// the reason given.
//
// Near misses ("partial fits") are grid starts inside opening hours, notice and part of day that
// fail exactly one rule: the chair is free but the provider is with another patient, or the
// provider is free but the chair is booked. "The provider is not on shift" is offered only when
// the desk chose that provider: otherwise another provider's shift says more.
import type { PartialFit, PartialFitProblem } from '../types/openings'
import { buildSearchContext, type ChairCandidate, type ProviderCandidate, type SearchContext } from './openings-context'
import { StartCursor, type Pairing } from './openings-cursor'
import { chairStartWindows, intersectWindows, providerStartWindows, windowsContain, type StartWindow } from './openings-windows'

const NEAREST_COUNT = 3
// Bounds the near-miss scan per pair: it only runs when nothing fits, but must stay quick.
const NEAREST_SCAN_LIMIT = 5_000

export const OPENINGS_REASONS = {
  noEquipment: (capability: string) => `No chair at these sites has the needed equipment (${capability})`,
  chosenChairUnfit: (capability: string) => `The chosen chair is not in use or lacks the needed equipment (${capability})`,
  chosenProviderUnfit: 'The chosen provider does not do this procedure at these sites',
  noProviderOnShift: 'No provider who does this procedure is on shift at these sites in this range',
  outsideOpeningHours: 'Outside opening hours',
  tooSoon: (minutes: number) => (minutes > 0 ? `Too soon: visits need ${minutes} minutes' notice` : 'Too soon: that time has passed'),
  noPartOfDay: (part: string) => `No ${part} times in this range`,
  everyChairBusy: 'Every suitable chair is busy',
  providerOffWhenChairFree: 'No provider who does this procedure is on shift when a suitable chair is free',
  providerBusyWhenChairFree: 'The providers who do this procedure are with other patients whenever a suitable chair is free',
} as const

const PARTIAL_NOTES: Record<PartialFitProblem, string> = {
  provider_busy: 'The chair is free but the provider is with another patient',
  provider_off_shift: 'The chair is free but the provider is not on shift',
  chair_busy: 'The provider is free but the chair is booked',
}

type ChairTime = 'open' | 'free'
type ProviderTime = 'onShift' | 'free'

function chairWindows(ctx: SearchContext, chair: ChairCandidate, time: ChairTime): StartWindow[] {
  return intersectWindows(chairStartWindows(chair[time], ctx.chairMs), [ctx.bound])
}

function providerWindows(ctx: SearchContext, provider: ProviderCandidate, time: ProviderTime): StartWindow[] {
  return intersectWindows(providerStartWindows(provider[time], ctx.handsOn), [ctx.bound])
}

function firstStart(ctx: SearchContext, siteIndex: number, windows: StartWindow[], withPartOfDay: boolean): number | null {
  const site = ctx.sites[siteIndex]!.site
  const pairing: Pairing = { siteId: site.id, operatoryId: 0, providerId: 0, timeZone: site.timeZone, unitMinutes: site.bookingUnitMinutes, windows, rank: 0 }
  return new StartCursor(pairing, withPartOfDay ? ctx.partOfDay : 'any').current
}

function anyChairStart(ctx: SearchContext, time: ChairTime, withPartOfDay: boolean): boolean {
  return ctx.sites.some((entry, i) => entry.chairs.some((chair) => firstStart(ctx, i, chairWindows(ctx, chair, time), withPartOfDay) !== null))
}

function anyPairStart(ctx: SearchContext, providerTime: ProviderTime): boolean {
  return ctx.sites.some((entry, i) =>
    entry.chairs.some((chair) => {
      const free = chairWindows(ctx, chair, 'free')
      return entry.providers.some((p) => firstStart(ctx, i, intersectWindows(free, providerWindows(ctx, p, providerTime)), true) !== null)
    }),
  )
}

function whoCanTreatReason(ctx: SearchContext): string | null {
  const { query } = ctx
  const withChairs = ctx.sites.filter((entry) => entry.chairs.length > 0)
  if (withChairs.length === 0) {
    return query.operatoryId === undefined ? OPENINGS_REASONS.noEquipment(query.capability) : OPENINGS_REASONS.chosenChairUnfit(query.capability)
  }
  if (query.providerId !== undefined && withChairs.every((entry) => entry.providers.length === 0)) {
    return OPENINGS_REASONS.chosenProviderUnfit
  }
  if (withChairs.every((entry) => entry.providers.every((p) => p.onShift.length === 0))) return OPENINGS_REASONS.noProviderOnShift
  return null
}

function timeReason(ctx: SearchContext): string {
  const { query } = ctx
  if (!anyChairStart(ctx, 'open', false)) {
    const withoutNotice = buildSearchContext(query, true)
    return anyChairStart(withoutNotice, 'open', false) ? OPENINGS_REASONS.tooSoon(query.minimumNoticeMinutes) : OPENINGS_REASONS.outsideOpeningHours
  }
  if (!anyChairStart(ctx, 'open', true)) return OPENINGS_REASONS.noPartOfDay(ctx.partOfDay)
  if (!anyChairStart(ctx, 'free', true)) return OPENINGS_REASONS.everyChairBusy
  if (!anyPairStart(ctx, 'onShift')) return OPENINGS_REASONS.providerOffWhenChairFree
  return OPENINGS_REASONS.providerBusyWhenChairFree
}

/** The one firmest rule that leaves no opening. */
export function noOpeningReasons(ctx: SearchContext): string[] {
  // Who can treat is judged over the whole range: the notice must not hide a provider's shift.
  return [whoCanTreatReason(buildSearchContext(ctx.query, true)) ?? timeReason(ctx)]
}

interface PairTimes {
  chairFree: StartWindow[]
  providerFree: StartWindow[]
  providerOnShift: StartWindow[]
}

function problemAt(times: PairTimes, start: number, offShiftCounts: boolean): PartialFitProblem | null {
  const chairFree = windowsContain(times.chairFree, start)
  const providerFree = windowsContain(times.providerFree, start)
  if (chairFree && !providerFree) {
    if (windowsContain(times.providerOnShift, start)) return 'provider_busy'
    return offShiftCounts ? 'provider_off_shift' : null
  }
  return !chairFree && providerFree ? 'chair_busy' : null
}

function partialFitsOfPair(ctx: SearchContext, pairing: Pairing, times: PairTimes): PartialFit[] {
  const fits: PartialFit[] = []
  const cursor = new StartCursor(pairing, ctx.partOfDay)
  const offShiftCounts = ctx.query.providerId !== undefined
  for (let scanned = 0; cursor.current !== null && scanned < NEAREST_SCAN_LIMIT && fits.length < NEAREST_COUNT; scanned++) {
    const startMs = cursor.current
    const problem = problemAt(times, startMs, offShiftCounts)
    if (problem) {
      const { siteId, operatoryId, providerId } = pairing
      fits.push({ siteId, operatoryId, providerId, startMs, endMs: startMs + ctx.chairMs, problem, note: PARTIAL_NOTES[problem] })
    }
    cursor.advance()
  }
  return fits
}

/** Up to three near misses, earliest first, one per chair and start. */
export function nearestPartialFits(ctx: SearchContext): PartialFit[] {
  const found: PartialFit[] = []
  ctx.sites.forEach((entry) => {
    for (const chair of entry.chairs) {
      const open = chairWindows(ctx, chair, 'open')
      const chairFree = chairWindows(ctx, chair, 'free')
      for (const provider of entry.providers) {
        const times = { chairFree, providerFree: providerWindows(ctx, provider, 'free'), providerOnShift: providerWindows(ctx, provider, 'onShift') }
        const { site } = entry
        const pairing: Pairing = {
          siteId: site.id, operatoryId: chair.operatoryId, providerId: provider.providerId,
          timeZone: site.timeZone, unitMinutes: site.bookingUnitMinutes, windows: open, rank: 0,
        }
        found.push(...partialFitsOfPair(ctx, pairing, times))
      }
    }
  })
  found.sort((a, b) => a.startMs - b.startMs || a.siteId - b.siteId || a.operatoryId - b.operatoryId || a.providerId - b.providerId)
  const seen = new Set<string>()
  return found.filter((fit) => {
    const key = `${fit.operatoryId}@${fit.startMs}`
    if (seen.has(key)) return false
    seen.add(key)
    return true
  }).slice(0, NEAREST_COUNT)
}

export function explainNoOpenings(ctx: SearchContext): { reasons: string[]; nearest: PartialFit[] } {
  return { reasons: noOpeningReasons(ctx), nearest: nearestPartialFits(ctx) }
}
