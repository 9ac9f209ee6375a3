// What one Openings search works on (shared/domain/openings-context.ts): which chairs and providers
// are candidates, their open and free time, and the bound on starts. Common practice, no source:
// a chair is held by every segment of another visit; a provider only by hands-on work (during a
// numbing wait or an assistant's step they may treat someone else).
import { describe, expect, it } from 'vitest'
import { buildSearchContext, earliestStartMs } from '../../../../shared/domain/openings-context'
import { at, CHAIR, DENTIST, HYGIENE_CHAIR, HYGIENIST, query, RETIRED_CHAIR, SECOND_DENTIST, segment, span } from '../../../support/openings-fixture'

const MINUTE_MS = 60_000

describe('candidates', () => {
  it('takes only active chairs with the capability and providers who do the category', () => {
    const [site] = buildSearchContext(query()).sites
    expect(site!.chairs.map((chair) => chair.operatoryId)).toEqual([CHAIR])
    expect(site!.providers.map((provider) => provider.providerId)).toEqual([DENTIST, SECOND_DENTIST])
    // A hygiene visit finds the other chair and the hygienist, not the retired chair.
    const [hygiene] = buildSearchContext(query({ capability: 'hygiene', category: 'preventive' })).sites
    expect(hygiene!.chairs.map((chair) => chair.operatoryId)).toEqual([HYGIENE_CHAIR])
    expect(hygiene!.providers.map((provider) => provider.providerId)).toEqual([HYGIENIST])
  })

  it('narrows to the chosen chair and provider, and a chosen chair that is retired or unequipped leaves none', () => {
    const [chosen] = buildSearchContext(query({ operatoryId: CHAIR, providerId: SECOND_DENTIST })).sites
    expect(chosen!.chairs.map((chair) => chair.operatoryId)).toEqual([CHAIR])
    expect(chosen!.providers.map((provider) => provider.providerId)).toEqual([SECOND_DENTIST])
    expect(buildSearchContext(query({ operatoryId: RETIRED_CHAIR })).sites[0]!.chairs).toEqual([])
    expect(buildSearchContext(query({ operatoryId: HYGIENE_CHAIR })).sites[0]!.chairs).toEqual([])
    expect(buildSearchContext(query({ providerId: HYGIENIST })).sites[0]!.providers).toEqual([])
  })

  it('keeps a provider with no time here as a candidate with empty time (so "not on shift" can be told apart)', () => {
    const second = buildSearchContext(query()).sites[0]!.providers.find((provider) => provider.providerId === SECOND_DENTIST)!
    expect(second).toEqual({ siteId: 1, providerId: SECOND_DENTIST, onShift: [], free: [] })
  })
})

describe('open and free time', () => {
  it('a chair is held by every segment of another visit, merged, and free is open minus held', () => {
    const busy = [
      segment(CHAIR, 99, 'hands_on', '09:00', '09:20'),
      segment(CHAIR, 99, 'numbing', '09:20', '09:30'),
      segment(CHAIR, null, 'reset', '09:30', '09:40'),
      segment(HYGIENE_CHAIR, 98, 'hands_on', '10:00', '11:00'),
    ]
    const chair = buildSearchContext(query({ busy })).sites[0]!.chairs[0]!
    expect(chair.open).toEqual([span('08:00', '12:00')])
    expect(chair.busy).toEqual([span('09:00', '09:40')])
    expect(chair.free).toEqual([span('08:00', '09:00'), span('09:40', '12:00')])
  })

  it('a provider is held only by hands-on work, in any chair at any site', () => {
    const busy = [
      segment(555, DENTIST, 'hands_on', '08:30', '09:00'), // another site's chair
      segment(555, DENTIST, 'numbing', '09:00', '09:15'), // onset wait: free to treat someone else
      segment(556, DENTIST, 'assist', '10:00', '10:30'), // an assistant's step
      segment(556, DENTIST, 'hands_on', '10:30', '10:45'),
    ]
    const dentist = buildSearchContext(query({ busy })).sites[0]!.providers.find((provider) => provider.providerId === DENTIST)!
    expect(dentist.onShift).toEqual([span('08:00', '12:00')])
    expect(dentist.free).toEqual([span('08:00', '08:30'), span('09:00', '10:30'), span('10:45', '12:00')])
    // The chair is not touched by visits in other chairs.
    expect(buildSearchContext(query({ busy })).sites[0]!.chairs[0]!.free).toEqual([span('08:00', '12:00')])
  })

  it('leaves out visits and hours the search cannot touch: before the first start, or after the last start plus one visit', () => {
    const busy = [segment(CHAIR, 99, 'hands_on', '06:00', '07:00'), segment(CHAIR, 99, 'hands_on', '10:00', '10:30')]
    // Starts from 09:00 up to 09:30: the visit can reach 10:30 at the latest.
    const chair = buildSearchContext(query({ busy, fromMs: at('09:00'), toMs: at('09:30') })).sites[0]!.chairs[0]!
    expect(chair.busy).toEqual([span('10:00', '10:30')])
    const early = buildSearchContext(query({ busy, fromMs: at('07:30'), toMs: at('08:00') })).sites[0]!.chairs[0]!
    expect(early.busy).toEqual([])
  })
})

describe('the bound on starts', () => {
  it('starts no sooner than the range or now plus the notice, and before the end of the range', () => {
    const ahead = query()
    expect(buildSearchContext(ahead).bound).toEqual({ firstMs: at('08:00'), lastMs: at('17:00') - 1 })
    const sameDay = query({ nowMs: at('10:07'), minimumNoticeMinutes: 30 })
    expect(earliestStartMs(sameDay)).toBe(at('10:37'))
    expect(buildSearchContext(sameDay).bound.firstMs).toBe(at('10:37'))
    // Explaining "too soon" looks at the range as if there were no notice.
    expect(buildSearchContext(sameDay, true).bound.firstMs).toBe(at('08:00'))
  })

  it('carries the plan\'s length, its hands-on stretches and the part of day', () => {
    const context = buildSearchContext(query({ partOfDay: 'afternoon' }))
    expect(context.chairMs).toBe(60 * MINUTE_MS)
    expect(context.handsOn.map((stretch) => [stretch.offsetMs / MINUTE_MS, stretch.lengthMs / MINUTE_MS])).toEqual([[0, 20], [30, 20]])
    expect(context.partOfDay).toBe('afternoon')
    expect(buildSearchContext(query()).partOfDay).toBe('any')
  })
})
