// Who may do what to one visit, and when (the rule the server enforces and the screens offer).
// Common practice, no source: the desk books and rebooks, the treating provider moves their own
// patients through the chair, chairside staff record the anaesthetic.
import { describe, expect, it } from 'vitest'
import {
  DESK_ONLY, mayChangeState, mayRebook, mayRecordAnaesthetic, NOT_YOUR_VISIT, visitOffers, type VisitActor, type VisitFacts,
} from '../../../../shared/domain/visit-access'

const START = Date.parse('2026-03-10T16:00:00Z') // 09:00 in Los Angeles
const visit = (overrides: Partial<VisitFacts> = {}): VisitFacts => ({
  state: 'booked', startUtc: new Date(START).toISOString(), timeZone: 'America/Los_Angeles', clock: '12h', dateOrder: 'month-day-year', siteId: 1, providerId: 7, ...overrides,
})
const actor = (overrides: Partial<VisitActor> = {}): VisitActor => ({ role: 'front_desk', allSites: false, siteIds: [1], providerId: null, ...overrides })
const MINUTE = 60_000

describe('mayChangeState', () => {
  it('lets the site\'s desk and the visit\'s own provider mark arrival from an hour before the start', () => {
    expect(mayChangeState(actor(), visit(), 'arrived', START - 30 * MINUTE)).toEqual({ allowed: true })
    expect(mayChangeState(actor({ role: 'dentist', providerId: 7, siteIds: [] }), visit(), 'arrived', START)).toEqual({ allowed: true })
    const early = mayChangeState(actor(), visit(), 'arrived', START - 3 * 60 * MINUTE)
    expect(early).toMatchObject({ allowed: false, status: 409 })
  })

  it('refuses another provider, and the desk of another site, with 403', () => {
    expect(mayChangeState(actor({ role: 'dentist', providerId: 8 }), visit(), 'arrived', START)).toEqual({ allowed: false, status: 403, reason: NOT_YOUR_VISIT })
    expect(mayChangeState(actor({ siteIds: [2] }), visit(), 'arrived', START)).toMatchObject({ allowed: false, status: 403 })
  })

  it('refuses a move the states do not allow with 409 in words', () => {
    const verdict = mayChangeState(actor(), visit({ state: 'finished' }), 'arrived', START)
    expect(verdict).toMatchObject({ allowed: false, status: 409 })
    expect(verdict.allowed ? '' : verdict.reason).toMatch(/finished cannot become arrived/)
  })

  it('leaves cancelling to the desk, even for the visit\'s own provider', () => {
    expect(mayChangeState(actor({ role: 'dentist', providerId: 7 }), visit(), 'cancelled', START - 60 * MINUTE)).toEqual({ allowed: false, status: 403, reason: DESK_ONLY })
  })
})

describe('mayRebook', () => {
  it('lets the desk move a visit still holding its time, in treatment too, but not a closed one', () => {
    expect(mayRebook(actor(), visit({ state: 'treating' }))).toEqual({ allowed: true })
    expect(mayRebook(actor(), visit({ state: 'cancelled' }))).toMatchObject({ allowed: false, status: 409 })
    expect(mayRebook(actor({ role: 'hygienist', providerId: 7 }), visit())).toEqual({ allowed: false, status: 403, reason: DESK_ONLY })
  })
})

describe('visitOffers', () => {
  it('leaves out what the role may not do and shows what the clock does not allow yet, with its reason', () => {
    const offers = visitOffers(actor({ role: 'dentist', providerId: 7 }), visit({ state: 'arrived' }), START, ['arrived', 'treating', 'finished'])
    expect(offers.states.map((offer) => offer.to)).toEqual(['treating'])
    const tooEarly = visitOffers(actor(), visit(), START - 3 * 60 * MINUTE, ['arrived']).states
    expect(tooEarly).toMatchObject([{ to: 'arrived', verdict: { allowed: false, status: 409 } }])
    expect(offers.rebook).toMatchObject({ allowed: false, status: 403 })
    expect(offers.cancel).toMatchObject({ allowed: false, status: 403 })
    expect(visitOffers(actor({ role: 'dentist', providerId: 8 }), visit(), START, ['arrived']).states).toEqual([])
  })
})

describe('mayRecordAnaesthetic', () => {
  it('is chairside work: the own provider, the site\'s assistants, managers and admins; not the front desk', () => {
    expect(mayRecordAnaesthetic(actor({ role: 'dentist', providerId: 7, siteIds: [] }), visit())).toEqual({ allowed: true })
    expect(mayRecordAnaesthetic(actor({ role: 'assistant' }), visit())).toEqual({ allowed: true })
    expect(mayRecordAnaesthetic(actor({ role: 'assistant', siteIds: [2] }), visit())).toMatchObject({ allowed: false, status: 403 })
    expect(mayRecordAnaesthetic(actor(), visit())).toMatchObject({ allowed: false, status: 403 })
  })
})
