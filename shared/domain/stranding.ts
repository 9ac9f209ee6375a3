// Whether a booked visit still holds on its site's calendar, and if not, why, in plain words.
// The same questions the booking transaction asks (server/services/booking-rules.ts): the chair is
// in use and equipped, the provider is active and does the procedures, the chair is open and not
// blocked for the whole visit, the provider is on shift for every hands-on part. A visit that fails
// one is "stranded" (glossary: it needs a new time) and goes on the site's Rebook list. Pure.
import type { EpochInterval, ExpandAvailabilityInput } from '../types/rota'
import { TIME_OFF_SHOWN_AS } from '../utils/access'
import { localDateAt } from '../utils/local-date'
import { expandAvailabilityMs, isSiteClosedOn } from './rota'

const DAY_MS = 86_400_000

export type SiteCalendarParts = Omit<ExpandAvailabilityInput, 'fromUtc' | 'toUtc'>

export interface StrandCheck {
  calendar: SiteCalendarParts
  /** The visit's chair as the site has it now; undefined when it is not a chair of this site. */
  room: { id: number; name: string; capabilities: readonly string[]; active: boolean } | undefined
  /** The visit's provider now; `active` false when the provider row or the account is inactive. */
  provider: { id: number; name: string; capabilities: readonly string[]; active: boolean } | undefined
  /** What each procedure of the visit needs (the template's current version). */
  needs: ReadonlyArray<{ name: string; capability: string; category: string }>
  startMs: number
  endMs: number
  /** The provider's hands-on parts of the visit. */
  handsOn: readonly EpochInterval[]
}

function covered(intervals: readonly EpochInterval[], startMs: number, endMs: number): boolean {
  return intervals.some((interval) => interval.startMs <= startMs && interval.endMs >= endMs)
}

function overlaps(a: EpochInterval, b: EpochInterval): boolean {
  return a.startMs < b.endMs && a.endMs > b.startMs
}

function expand(check: StrandCheck, parts: Partial<SiteCalendarParts>) {
  return expandAvailabilityMs({
    ...check.calendar, ...parts,
    fromUtc: new Date(check.startMs - DAY_MS).toISOString(), toUtc: new Date(check.endMs + DAY_MS).toISOString(),
  })
}

function roomProblem(check: StrandCheck, roomId: number, roomName: string): string | null {
  const { calendar, startMs, endMs } = check
  const operatories = calendar.operatories.filter((operatory) => operatory.id === roomId)
  const withBlocks = expand(check, { operatories, shifts: [], exceptions: [] })
  if (covered(withBlocks.operatories[0]?.intervals ?? [], startMs, endMs)) return null
  const date = localDateAt(startMs, calendar.site.timeZone)
  if (isSiteClosedOn(calendar.site, date)) return `The site is closed on ${date}`
  const open = expand(check, { operatories, shifts: [], exceptions: [], blocks: [] })
  if (!covered(open.operatories[0]?.intervals ?? [], startMs, endMs)) return "Outside the site's opening hours"
  const visit = { startMs, endMs }
  const block = withBlocks.blocks.find((one) => one.providerId === null && (one.operatoryId === null || one.operatoryId === roomId) && overlaps(one, visit))
  if (block?.operatoryId === null) return `The site is blocked: ${block.reason}`
  return `${roomName} is blocked${block ? `: ${block.reason}` : ''}`
}

function providerProblem(check: StrandCheck, providerId: number, providerName: string): string | null {
  const { calendar } = check
  const mine = {
    shifts: calendar.shifts.filter((shift) => shift.providerId === providerId),
    exceptions: calendar.exceptions.filter((exception) => exception.providerId === providerId),
    blocks: calendar.blocks.filter((block) => block.providerId === providerId || (block.operatoryId === null && block.providerId === null)),
  }
  const timeOf = (parts: Partial<SiteCalendarParts>) =>
    expand(check, { operatories: [], ...mine, ...parts }).providers.find((entry) => entry.providerId === providerId)?.intervals ?? []
  const time = timeOf({})
  const gap = check.handsOn.find((segment) => !covered(time, segment.startMs, segment.endMs))
  if (!gap) return null
  // Time off wins over a block: it is what the front desk will hear from the provider.
  const withoutTimeOff = timeOf({ exceptions: mine.exceptions.filter((exception) => exception.kind !== 'time_off') })
  if (covered(withoutTimeOff, gap.startMs, gap.endMs)) return `${providerName} is ${TIME_OFF_SHOWN_AS}`
  const block = expand(check, { operatories: [], ...mine }).blocks.find((one) => one.providerId === providerId && overlaps(one, gap))
  if (block) return `${providerName} is blocked: ${block.reason}`
  return `${providerName} is not on shift then`
}

/** Null when the visit still holds; otherwise the first reason it does not, in plain words. */
export function strandReason(check: StrandCheck): string | null {
  const { room, provider } = check
  if (!room || !room.active) return `${room?.name ?? 'Its chair'} is out of use`
  const unequipped = check.needs.find((need) => !room.capabilities.includes(need.capability))
  if (unequipped) return `${room.name} is not equipped for ${unequipped.capability} (${unequipped.name})`
  if (!provider || !provider.active) return `${provider?.name ?? 'Its provider'} no longer sees patients`
  const unskilled = check.needs.find((need) => !provider.capabilities.includes(need.category))
  if (unskilled) return `${provider.name} does not do ${unskilled.category} procedures (${unskilled.name})`
  return roomProblem(check, room.id, room.name) ?? providerProblem(check, provider.id, provider.name)
}

/**
 * The heading over a list of stranded visits: "3 booked visits would lose their dentist" when the
 * change takes a provider away (`loses` is their kind), otherwise "… would need a new time".
 */
export function strandedHeading(count: number, loses?: 'dentist' | 'hygienist'): string {
  const visits = `${count} booked visit${count === 1 ? '' : 's'}`
  return loses ? `${visits} would lose ${count === 1 ? 'its' : 'their'} ${loses}` : `${visits} would need a new time`
}
