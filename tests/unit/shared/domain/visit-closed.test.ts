// One rule for "can this visit still be moved?" and "is it closed?" (shared/domain/visit-states.ts),
// and how visit-access.ts builds on it for the desk (move and length) and for cancelling.
// Our own product rule: common practice, no source.
import { describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { canMove, isClosed, VISIT_STATES, type VisitState } from '../../../../shared/domain/visit-states'
import { mayRebook, visitOffers, type VisitActor, type VisitFacts } from '../../../../shared/domain/visit-access'

describe('isClosed and canMove', () => {
  it('closes finished, missed and cancelled visits and nothing else', () => {
    const closed = VISIT_STATES.filter(isClosed)
    expect(closed).toEqual(['finished', 'missed', 'cancelled'])
  })
  it('lets every open visit be moved, a visit in treatment included', () => {
    expect(VISIT_STATES.filter(canMove)).toEqual(['booked', 'confirmed', 'arrived', 'treating'])
    for (const state of VISIT_STATES) expect(canMove(state)).toBe(!isClosed(state))
  })
})

describe('the desk\'s offers follow canMove', () => {
  const zone = 'America/Denver'
  // Any instant works: a visit an hour from now, on its local day in its own zone.
  const nowMs = DateTime.now().setZone(zone).startOf('day').plus({ hours: 11 }).toMillis()
  const desk: VisitActor = { role: 'front_desk', allSites: false, siteIds: [1], providerId: null }
  const visit = (state: VisitState): VisitFacts => ({
    state, siteId: 1, providerId: 10, timeZone: zone, clock: '24h', dateOrder: 'day-month-year', startUtc: new Date(nowMs + 3_600_000).toISOString(),
  })

  it('offers move and length exactly for the states canMove allows', () => {
    for (const state of VISIT_STATES) expect(mayRebook(desk, visit(state)).allowed).toBe(canMove(state))
  })
  it('moves a visit in treatment but no longer cancels it', () => {
    const offers = visitOffers(desk, visit('treating'), nowMs, ['finished'])
    expect(offers.rebook).toEqual({ allowed: true })
    expect(offers.cancel).toMatchObject({ allowed: false, status: 409 })
  })
  it('cancels a booked visit, and neither moves nor cancels a finished one', () => {
    expect(visitOffers(desk, visit('booked'), nowMs, []).cancel).toEqual({ allowed: true })
    const finished = visitOffers(desk, visit('finished'), nowMs, [])
    expect(finished.rebook).toMatchObject({ allowed: false, status: 409 })
    expect(finished.cancel).toMatchObject({ allowed: false, status: 409 })
  })
})
