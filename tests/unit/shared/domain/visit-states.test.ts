// When a visit may take a state (shared/domain/visit-states.ts) and who may set it
// (shared/domain/visit-access.ts). Zone rules: the IANA tz database as luxon reads it; DST dates
// for 2026 are US rules (second Sunday in March, first Sunday in November; Energy Policy Act 2005).
import { describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { stateTimeProblem, type VisitTiming } from '../../../../shared/domain/visit-states'
import { mayChangeState, mayRebook, visitOffers, NOT_YOUR_VISIT, DESK_ONLY, type VisitActor, type VisitFacts } from '../../../../shared/domain/visit-access'

const LA = 'America/Los_Angeles'
const at = (local: string, zone = LA) => DateTime.fromISO(local, { zone }).toMillis()
// Most refusals below are read at a site with a 24-hour clock and the day first; the last block
// reads them at a site with a 12-hour clock and the month first.
const DAY_FIRST_24 = { clock: '24h', dateOrder: 'day-month-year' } as const
const visitAt = (local: string, state: VisitTiming['state'] = 'booked', zone = LA): VisitTiming => ({
  state, startUtc: DateTime.fromISO(local, { zone }).toUTC().toISO()!, timeZone: zone, ...DAY_FIRST_24,
})

describe('arrived', () => {
  const visit = visitAt('2026-12-07T14:00')
  it('is allowed from 60 minutes before the start until the end of the local day', () => {
    expect(stateTimeProblem(visit, 'arrived', at('2026-12-07T13:00'))).toBeNull()
    expect(stateTimeProblem(visit, 'arrived', at('2026-12-07T23:59'))).toBeNull()
  })
  it('is refused earlier that day, naming when it opens', () => {
    expect(stateTimeProblem(visit, 'arrived', at('2026-12-07T12:59'))).toBe('The visit starts at 14:00: it can be marked arrived from 13:00, 60 minutes before.')
  })
  it('is refused on another day, naming the visit\'s day', () => {
    expect(stateTimeProblem(visit, 'arrived', at('2026-11-09T14:00'))).toBe('Mon 7 Dec is not today: a visit can be marked arrived only on its day.')
    expect(stateTimeProblem(visit, 'arrived', at('2026-12-08T00:00'))).toBe('Mon 7 Dec is not today: a visit can be marked arrived only on its day.')
  })
  it('goes by the site\'s day, not UTC: 17:00 in Los Angeles is already tomorrow in UTC', () => {
    const evening = visitAt('2026-12-07T17:30')
    expect(stateTimeProblem(evening, 'arrived', at('2026-12-07T17:00'))).toBeNull()
    // The same instant, seen from a site in Auckland, is a different local day.
    const auckland = { ...evening, timeZone: 'Pacific/Auckland' }
    expect(stateTimeProblem(auckland, 'arrived', at('2026-12-07T17:00'))).toBeNull()
    expect(stateTimeProblem(auckland, 'arrived', at('2026-12-06T17:00'))).toMatch(/is not today/)
  })
  it('counts the 60 minutes in real time across the spring-forward gap', () => {
    // 8 Mar 2026 in Los Angeles: 02:00 jumps to 03:00. A 03:30 visit may be marked arrived from 01:30 (PST), an hour of real time earlier.
    const visit = visitAt('2026-03-08T03:30')
    expect(stateTimeProblem(visit, 'arrived', DateTime.fromISO('2026-03-08T01:30', { zone: LA }).toMillis())).toBeNull()
    expect(stateTimeProblem(visit, 'arrived', DateTime.fromISO('2026-03-08T01:29', { zone: LA }).toMillis())).toBe('The visit starts at 03:30: it can be marked arrived from 01:30, 60 minutes before.')
  })
  it('keeps the local day whole on the fall-back day (25 hours)', () => {
    // 1 Nov 2026: 01:00–02:00 happens twice. 23:30 that evening is still the same local day.
    const visit = visitAt('2026-11-01T00:30')
    expect(stateTimeProblem(visit, 'treating', at('2026-11-01T23:30'))).toBeNull()
    expect(stateTimeProblem(visit, 'treating', at('2026-11-02T00:00'))).toBe('Sun 1 Nov is not today: a visit can be marked in treatment only on its day.')
  })
})

describe('missed (did not come)', () => {
  const visit = visitAt('2026-12-07T14:00')
  it('is refused before the start, weeks ahead or minutes ahead', () => {
    const text = 'The visit starts Mon 7 Dec at 14:00: it can be marked did not come only after its start.'
    expect(stateTimeProblem(visit, 'missed', at('2026-11-02T09:00'))).toBe(text)
    expect(stateTimeProblem(visit, 'missed', at('2026-12-07T13:59'))).toBe(text)
  })
  it('is allowed from the start, that day or later', () => {
    expect(stateTimeProblem(visit, 'missed', at('2026-12-07T14:00'))).toBeNull()
    expect(stateTimeProblem(visit, 'missed', at('2026-12-09T08:00'))).toBeNull()
  })
})

describe('refusals on the site\'s clock and date order (issue 14)', () => {
  const us = { ...visitAt('2026-12-07T14:00'), clock: '12h', dateOrder: 'month-day-year' } as const
  const isoOrder = { ...visitAt('2026-12-07T14:00'), clock: '24h', dateOrder: 'year-month-day' } as const
  it('names times on a 12-hour clock and the date month first where the site reads so', () => {
    expect(stateTimeProblem(us, 'arrived', at('2026-12-07T12:59'))).toBe('The visit starts at 2:00 PM: it can be marked arrived from 1:00 PM, 60 minutes before.')
    expect(stateTimeProblem(us, 'missed', at('2026-12-07T09:00'))).toBe('The visit starts Mon, Dec 7 at 2:00 PM: it can be marked did not come only after its start.')
    expect(stateTimeProblem(us, 'arrived', at('2026-12-08T00:00'))).toBe('Mon, Dec 7 is not today: a visit can be marked arrived only on its day.')
  })
  it('names the date year first at a site that orders dates so, and the same instant on each site\'s own clock', () => {
    expect(stateTimeProblem(isoOrder, 'treating', at('2026-12-06T09:00'))).toBe('Mon 2026-12-07 is not today: a visit can be marked in treatment only on its day.')
    // 22:00 UTC: 14:00 in Los Angeles, 15:00 in Denver.
    const denver = { ...us, timeZone: 'America/Denver' }
    expect(stateTimeProblem(denver, 'arrived', at('2026-12-07T12:59'))).toBe('The visit starts at 3:00 PM: it can be marked arrived from 2:00 PM, 60 minutes before.')
  })
})

describe('treating and finished', () => {
  const visit = visitAt('2026-12-07T14:00', 'arrived')
  it('treating only on the visit\'s day', () => {
    expect(stateTimeProblem(visit, 'treating', at('2026-12-07T08:00'))).toBeNull()
    expect(stateTimeProblem(visit, 'treating', at('2026-11-02T14:00'))).toBe('Mon 7 Dec is not today: a visit can be marked in treatment only on its day.')
  })
  it('finished on its day, or later to close a visit left in treatment, never before', () => {
    const treating = { ...visit, state: 'treating' as const }
    expect(stateTimeProblem(treating, 'finished', at('2026-12-07T15:00'))).toBeNull()
    expect(stateTimeProblem(treating, 'finished', at('2026-12-08T08:00'))).toBeNull()
    expect(stateTimeProblem(treating, 'finished', at('2026-12-06T15:00'))).toBe('Mon 7 Dec is not today: a visit can be marked finished only on its day (or later, to close a visit left in treatment).')
  })
  it('confirming and cancelling have no time rule', () => {
    expect(stateTimeProblem(visit, 'confirmed', at('2026-11-02T14:00'))).toBeNull()
    expect(stateTimeProblem(visit, 'cancelled', at('2026-11-02T14:00'))).toBeNull()
  })
})

describe('who may change a visit', () => {
  const visit: VisitFacts = { siteId: 1, providerId: 10, state: 'booked', startUtc: DateTime.fromISO('2026-12-07T14:00', { zone: LA }).toUTC().toISO()!, timeZone: LA, ...DAY_FIRST_24 }
  const onTheDay = at('2026-12-07T14:05')
  const desk: VisitActor = { role: 'front_desk', allSites: false, siteIds: [1], providerId: null }
  const otherDesk: VisitActor = { role: 'front_desk', allSites: false, siteIds: [2], providerId: null }
  const manager: VisitActor = { role: 'manager', allSites: true, siteIds: [], providerId: null }
  const own: VisitActor = { role: 'dentist', allSites: false, siteIds: [1], providerId: 10 }
  const otherHygienist: VisitActor = { role: 'hygienist', allSites: false, siteIds: [1], providerId: 11 }
  const assistant: VisitActor = { role: 'assistant', allSites: false, siteIds: [1], providerId: null }

  it('lets the site\'s desk, managers and the visit\'s own provider move it through its states', () => {
    for (const actor of [desk, manager, own]) expect(mayChangeState(actor, visit, 'arrived', onTheDay)).toEqual({ allowed: true })
  })
  it('refuses another provider, an assistant and another site\'s desk with 403', () => {
    for (const actor of [otherHygienist, assistant, otherDesk]) {
      expect(mayChangeState(actor, visit, 'arrived', onTheDay)).toEqual({ allowed: false, status: 403, reason: NOT_YOUR_VISIT })
    }
  })
  it('answers who before when: another provider hears 403 even on the wrong day', () => {
    expect(mayChangeState(otherHygienist, visit, 'arrived', at('2026-11-02T14:00'))).toMatchObject({ status: 403 })
    expect(mayChangeState(own, visit, 'arrived', at('2026-11-02T14:00'))).toMatchObject({ status: 409 })
  })
  it('keeps moving, length and cancelling to the desk, and refuses them on a finished visit', () => {
    expect(mayRebook(desk, visit)).toEqual({ allowed: true })
    expect(mayRebook(own, visit)).toEqual({ allowed: false, status: 403, reason: DESK_ONLY })
    expect(mayRebook(desk, { ...visit, state: 'finished' })).toMatchObject({ allowed: false, status: 409 })
    expect(mayChangeState(desk, { ...visit, state: 'treating' }, 'cancelled', onTheDay)).toMatchObject({ allowed: false, status: 409 })
  })
  it('offers a screen only what the user may do: refused by role left out, refused by time shown with the reason', () => {
    const moves = ['arrived', 'treating', 'finished', 'missed'] as const
    expect(visitOffers(otherHygienist, visit, onTheDay, moves).states).toEqual([])
    const early = visitOffers(own, visit, at('2026-12-07T09:00'), moves)
    expect(early.states.map((offer) => offer.to)).toEqual(['arrived', 'missed'])
    expect(early.states.every((offer) => !offer.verdict.allowed)).toBe(true)
    expect(early.rebook.allowed).toBe(false)
    expect(visitOffers(desk, visit, onTheDay, moves).states.every((offer) => offer.verdict.allowed)).toBe(true)
  })
})
