// Why nothing fits, and the nearest near misses (shared/domain/openings-reasons.ts), asked of a
// search context directly. Common practice, no source: a front desk wants the firmest rule that
// leaves no time first (equipment before hours before other visits), and a near miss only where
// one rule alone is in the way.
import { describe, expect, it } from 'vitest'
import { buildSearchContext } from '../../../../shared/domain/openings-context'
import { explainNoOpenings, nearestPartialFits, noOpeningReasons, OPENINGS_REASONS } from '../../../../shared/domain/openings-reasons'
import type { OpeningsQuery } from '../../../../shared/types/openings'
import { at, CHAIR, DENTIST, HYGIENE_CHAIR, HYGIENIST, query, SECOND_DENTIST, segment, span } from '../../../support/openings-fixture'

const reasonsFor = (search: OpeningsQuery) => noOpeningReasons(buildSearchContext(search))

describe('who can treat', () => {
  it('no chair with the equipment, or the chosen chair lacks it', () => {
    expect(reasonsFor(query({ capability: 'surgical' }))).toEqual([OPENINGS_REASONS.noEquipment('surgical')])
    expect(reasonsFor(query({ operatoryId: HYGIENE_CHAIR }))).toEqual([OPENINGS_REASONS.chosenChairUnfit('restorative')])
  })

  it('the chosen provider does not do the procedure', () => {
    expect(reasonsFor(query({ providerId: HYGIENIST }))).toEqual([OPENINGS_REASONS.chosenProviderUnfit])
  })

  it('nobody who does it is on shift in the range, even when the notice would hide the shifts', () => {
    expect(reasonsFor(query({ times: { dentistShift: [] } }))).toEqual([OPENINGS_REASONS.noProviderOnShift])
    // The dentist works 08:00–12:00, but it is 11:30 with an hour's notice: the reason is the notice, not the shift.
    const late = query({ nowMs: at('11:30'), minimumNoticeMinutes: 60 })
    expect(reasonsFor(late)).toEqual([OPENINGS_REASONS.tooSoon(60)])
  })
})

describe('time', () => {
  it('outside opening hours when the range misses them', () => {
    // The dentist works all day; the chair is open only until noon.
    const afternoon = query({ fromMs: at('13:00'), toMs: at('17:00'), times: { dentistShift: [span('08:00', '17:00')] } })
    expect(reasonsFor(afternoon)).toEqual([OPENINGS_REASONS.outsideOpeningHours])
    // With nobody on shift in the range either, who can treat is the firmer reason.
    expect(reasonsFor(query({ fromMs: at('13:00'), toMs: at('17:00') }))).toEqual([OPENINGS_REASONS.noProviderOnShift])
  })

  it('too soon when the notice (or the clock) leaves no open time, and says which', () => {
    expect(reasonsFor(query({ nowMs: at('10:30'), minimumNoticeMinutes: 120 }))).toEqual(['Too soon: visits need 120 minutes\' notice'])
    expect(reasonsFor(query({ nowMs: at('11:30') }))).toEqual(['Too soon: that time has passed'])
  })

  it('no time in the part of day asked for', () => {
    expect(reasonsFor(query({ partOfDay: 'afternoon' }))).toEqual([OPENINGS_REASONS.noPartOfDay('afternoon')])
  })

  it('every suitable chair is busy', () => {
    const busy = [segment(CHAIR, 99, 'assist', '08:00', '12:00')]
    expect(reasonsFor(query({ busy }))).toEqual([OPENINGS_REASONS.everyChairBusy])
  })

  it('the chair is free only when no provider is on shift', () => {
    // Free 08:00–09:00 and 11:00–12:00; the dentists work 09:00–11:00.
    const busy = [segment(CHAIR, 99, 'assist', '09:00', '11:00')]
    const times = { dentistShift: [span('09:00', '11:00')] }
    expect(reasonsFor(query({ busy, times }))).toEqual([OPENINGS_REASONS.providerOffWhenChairFree])
  })

  it('the providers are with other patients whenever the chair is free', () => {
    // The chair is free all morning; the one dentist on shift treats someone in another chair all morning.
    const busy = [segment(555, DENTIST, 'hands_on', '08:00', '12:00')]
    expect(reasonsFor(query({ busy }))).toEqual([OPENINGS_REASONS.providerBusyWhenChairFree])
  })
})

describe('near misses', () => {
  it('names the chair free while the provider treats someone else, three at most, earliest first', () => {
    const busy = [segment(555, DENTIST, 'hands_on', '08:00', '12:00')]
    const nearest = nearestPartialFits(buildSearchContext(query({ busy })))
    expect(nearest).toHaveLength(3)
    expect(nearest.map((fit) => fit.startMs)).toEqual([at('08:00'), at('08:05'), at('08:10')])
    expect(nearest[0]).toEqual({
      siteId: 1, operatoryId: CHAIR, providerId: DENTIST, startMs: at('08:00'), endMs: at('09:00'),
      problem: 'provider_busy', note: 'The chair is free but the provider is with another patient',
    })
  })

  it('names the provider free while the chair is booked', () => {
    const busy = [segment(CHAIR, 99, 'assist', '08:00', '12:00')]
    const nearest = nearestPartialFits(buildSearchContext(query({ busy })))
    expect(nearest[0]).toMatchObject({ operatoryId: CHAIR, providerId: DENTIST, startMs: at('08:00'), problem: 'chair_busy', note: 'The provider is free but the chair is booked' })
  })

  it('offers "not on shift" only when the desk chose that provider', () => {
    // The chosen second dentist has no shift; the first one is busy all morning.
    const busy = [segment(555, DENTIST, 'hands_on', '08:00', '12:00')]
    const chosen = nearestPartialFits(buildSearchContext(query({ busy, providerId: SECOND_DENTIST })))
    expect(chosen.map((fit) => [fit.providerId, fit.problem])).toEqual([[SECOND_DENTIST, 'provider_off_shift'], [SECOND_DENTIST, 'provider_off_shift'], [SECOND_DENTIST, 'provider_off_shift']])
    expect(chosen[0]!.note).toBe('The chair is free but the provider is not on shift')
    // Without a choice, the busy dentist says more than the one who is not in.
    const open = nearestPartialFits(buildSearchContext(query({ busy })))
    expect(open.every((fit) => fit.providerId === DENTIST && fit.problem === 'provider_busy')).toBe(true)
  })

  it('lists each chair and start once, and none when two rules are in the way at once', () => {
    // Both dentists on shift and both busy: the same chair and start is one near miss, not two.
    const busy = [segment(555, DENTIST, 'hands_on', '08:00', '12:00'), segment(556, SECOND_DENTIST, 'hands_on', '08:00', '12:00')]
    const both = nearestPartialFits(buildSearchContext(query({ busy, times: { secondDentistShift: [span('08:00', '12:00')] } })))
    expect(new Set(both.map((fit) => `${fit.operatoryId}@${fit.startMs}`)).size).toBe(both.length)
    // Chair booked and provider busy together: nothing is one rule away.
    const blocked = [segment(CHAIR, 99, 'assist', '08:00', '12:00'), segment(555, DENTIST, 'hands_on', '08:00', '12:00')]
    expect(nearestPartialFits(buildSearchContext(query({ busy: blocked, providerId: DENTIST })))).toEqual([])
  })

  it('explains with the reason and the near misses together', () => {
    const busy = [segment(CHAIR, 99, 'assist', '08:00', '12:00')]
    const explained = explainNoOpenings(buildSearchContext(query({ busy })))
    expect(explained.reasons).toEqual([OPENINGS_REASONS.everyChairBusy])
    expect(explained.nearest.length).toBeGreaterThan(0)
    expect(explained.nearest.every((fit) => fit.problem === 'chair_busy')).toBe(true)
  })
})
