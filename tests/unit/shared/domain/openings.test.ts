import { DateTime } from 'luxon'
import { describe, expect, it } from 'vitest'
import { planVisit } from '../../../../shared/domain/chair-time'
import { findOpenings, formatOpening } from '../../../../shared/domain/openings'
import { OPENINGS_REASONS } from '../../../../shared/domain/openings-reasons'
import { buildWeeklyRule } from '../../../../shared/domain/recurrence/build'
import { localToUtcMs } from '../../../../shared/utils/local-date'
import { expandAvailabilityMs } from '../../../../shared/domain/rota'
import type { BookingUnitMinutes, PlanItemInput, VisitPlan } from '../../../../shared/types/chair-time'
import type { BusySegment, Opening, OpeningsPlan, OpeningsQuery, OpeningsSite } from '../../../../shared/types/openings'
import type { BlockInput, IsoWeekday, OpeningHours, ShiftInput } from '../../../../shared/types/rota'
import { DEFAULT_TEMPLATES } from '../../../../seeds/data/procedure-templates'

const LOS_ANGELES = 'America/Los_Angeles'
const DENVER = 'America/Denver'
const PHOENIX = 'America/Phoenix'
const MINUTE_MS = 60_000

const DENTIST = 7
const SECOND_DENTIST = 8
const HYGIENIST = 9

function template(code: string) {
  const found = DEFAULT_TEMPLATES.find((t) => t.code === code)
  if (!found) throw new Error(`No seed template ${code}`)
  return found
}

function plan(items: PlanItemInput[], unitMinutes: BookingUnitMinutes = 5): VisitPlan {
  return planVisit(items, { unitMinutes })
}

/** A 2-surface posterior composite on tooth 19 (mandibular block, so a 10-min onset wait). */
const composite19 = (unit: BookingUnitMinutes = 5) => plan([{ template: template('COMP-POST'), tooth: '19', surfaces: 'MO' }], unit)

const EIGHT_TO_FIVE = [{ start: '08:00', end: '17:00' }]
const WEEKDAYS: OpeningHours = { '1': EIGHT_TO_FIVE, '2': EIGHT_TO_FIVE, '3': EIGHT_TO_FIVE, '4': EIGHT_TO_FIVE, '5': EIGHT_TO_FIVE, '6': [], '7': [] }

interface ProviderSpec {
  id: number
  categories: string[]
  weekdays?: IsoWeekday[]
  start?: string
  end?: string
}

interface SiteSpec {
  id?: number
  zone?: string
  unit?: BookingUnitMinutes
  hours?: OpeningHours
  operatories?: { id: number; capabilities: string[]; active?: boolean }[]
  providers?: ProviderSpec[]
  blocks?: BlockInput[]
  fromUtc?: string
  toUtc?: string
}

function makeSite(spec: SiteSpec = {}): OpeningsSite {
  const id = spec.id ?? 1
  const zone = spec.zone ?? LOS_ANGELES
  const operatories = (spec.operatories ?? [{ id: 100, capabilities: ['restorative'] }, { id: 101, capabilities: ['restorative', 'hygiene'] }])
    .map((o) => ({ id: o.id, siteId: id, active: o.active ?? true, capabilities: o.capabilities }))
  const providers = spec.providers ?? [{ id: DENTIST, categories: ['restorative', 'preventive'] }]
  const shifts: ShiftInput[] = providers.map((p, i) => ({
    id: id * 100 + i,
    providerId: p.id,
    siteId: id,
    rrule: buildWeeklyRule({ weekdays: p.weekdays ?? [1, 2, 3, 4, 5] }),
    startDate: '2025-12-01',
    untilDate: null,
    localStart: p.start ?? '07:30',
    localEnd: p.end ?? '17:30',
  }))
  const availability = expandAvailabilityMs({
    site: { id, timeZone: zone, openingHours: spec.hours ?? WEEKDAYS, closedDates: [] },
    operatories,
    shifts,
    exceptions: [],
    blocks: spec.blocks ?? [],
    fromUtc: spec.fromUtc ?? '2026-01-10T00:00:00Z',
    toUtc: spec.toUtc ?? '2026-01-20T00:00:00Z',
  })
  return { id, timeZone: zone, bookingUnitMinutes: spec.unit ?? 5, operatories, providers: providers.map((p) => ({ id: p.id, categories: p.categories })), availability }
}

/** Monday 12 January 2026 at a local wall time. */
const monday = (time: string, zone = LOS_ANGELES) => localToUtcMs('2026-01-12', time, zone)

function visit(visitPlan: OpeningsPlan, startMs: number, operatoryId: number, providerId: number | null): BusySegment[] {
  return visitPlan.segments.map((s) => ({
    operatoryId,
    providerId,
    kind: s.kind,
    startMs: startMs + s.startMinute * MINUTE_MS,
    endMs: startMs + s.endMinute * MINUTE_MS,
  }))
}

function query(overrides: Partial<OpeningsQuery> & Pick<OpeningsQuery, 'plan'>): OpeningsQuery {
  return {
    capability: 'restorative',
    category: 'restorative',
    sites: [makeSite()],
    busy: [],
    fromMs: monday('00:00'),
    toMs: monday('23:59'),
    nowMs: monday('00:00') - 7 * 86_400_000,
    minimumNoticeMinutes: 0,
    ...overrides,
  }
}

function localTimes(openings: readonly Opening[], zone: string): string[] {
  return openings.map((o) => DateTime.fromMillis(o.startMs, { zone }).toFormat('HH:mm'))
}

describe('findOpenings: the provider is free during numbing, assist and reset', () => {
  const composite = composite19()

  it('uses the plan the chair-time engine gives for COMP-POST on 19 MO', () => {
    expect(composite.chairMinutes).toBe(65)
    expect(composite.segments.filter((s) => s.kind === 'numbing').map((s) => [s.startMinute, s.endMinute])).toEqual([[7, 17]])
  })

  it('books a sealant in chair 2 with the same dentist during chair 1\'s onset wait', () => {
    const sealant = plan([{ template: template('SEAL'), tooth: '3' }])
    const busy = visit(composite, monday('08:00'), 100, DENTIST)
    const result = findOpenings(query({ plan: sealant, capability: 'hygiene', category: 'preventive', operatoryId: 101, busy, limit: 3 }))
    // Chair 1: injection 08:05–08:07, numb 08:07–08:17, treatment 08:17–08:52. Sealant hands-on is minutes 3–12.
    expect(localTimes(result.openings, LOS_ANGELES)).toEqual(['08:05', '08:50', '08:55'])
    expect(result.openings.every((o) => o.operatoryId === 101 && o.providerId === DENTIST)).toBe(true)
  })

  it('does not offer starts whose hands-on minutes meet the dentist\'s hands-on in chair 1', () => {
    const sealant = plan([{ template: template('SEAL'), tooth: '3' }])
    const busy = visit(composite, monday('08:00'), 100, DENTIST)
    const starts = localTimes(findOpenings(query({ plan: sealant, capability: 'hygiene', category: 'preventive', busy, limit: 1000 })).openings, LOS_ANGELES)
    // 08:00 → hands-on 08:03–08:12 meets the injection; 08:10 → 08:13–08:22 meets the treatment.
    for (const clash of ['08:00', '08:10', '08:15', '08:30', '08:45']) expect(starts).not.toContain(clash)
    expect(starts).toContain('08:05')
  })

  it('books a second composite with the same dentist once chair 1 is down to dismissal and reset', () => {
    const busy = visit(composite, monday('08:00'), 100, DENTIST)
    const [first] = findOpenings(query({ plan: composite, operatoryId: 101, busy, limit: 1 })).openings
    // Hands-on in chair 1 ends at 08:52, so the second injection (minute 5) can be at 08:55.
    expect(first && localTimes([first], LOS_ANGELES)).toEqual(['08:50'])
  })

  it('books the composite in chair 2 while the dentist is hands-on in chair 1 during chair 2\'s onset wait', () => {
    const quickCheck: OpeningsPlan = { chairMinutes: 15, segments: [{ kind: 'hands_on', startMinute: 0, endMinute: 5 }, { kind: 'reset', startMinute: 5, endMinute: 15 }] }
    const busy = visit(quickCheck, monday('08:10'), 100, DENTIST)
    const [first] = findOpenings(query({ plan: composite, operatoryId: 101, busy, limit: 1 })).openings
    expect(first && localTimes([first], LOS_ANGELES)).toEqual(['08:00'])
  })
})

describe('findOpenings: chairs', () => {
  it('offers only chairs with the needed capability', () => {
    const cleaning = plan([{ template: template('CLEAN-ADULT') }])
    const site = makeSite({ providers: [{ id: HYGIENIST, categories: ['hygiene'] }] })
    const result = findOpenings(query({ plan: cleaning, capability: 'hygiene', category: 'hygiene', sites: [site], limit: 50 }))
    expect(result.openings.length).toBe(50)
    expect(new Set(result.openings.map((o) => o.operatoryId))).toEqual(new Set([101]))
  })

  it('leaves out inactive chairs and providers who do not do the category', () => {
    const site = makeSite({
      operatories: [{ id: 100, capabilities: ['restorative'], active: false }, { id: 101, capabilities: ['restorative'] }],
      providers: [{ id: DENTIST, categories: ['restorative'] }, { id: HYGIENIST, categories: ['hygiene'] }],
    })
    const result = findOpenings(query({ plan: composite19(), sites: [site], limit: 100 }))
    expect(new Set(result.openings.map((o) => `${o.operatoryId}/${o.providerId}`))).toEqual(new Set(['101/7']))
  })

  it('never overlaps another visit in the chair, whoever the provider', () => {
    const composite = composite19()
    const busy = visit(composite, monday('09:00'), 100, SECOND_DENTIST)
    const result = findOpenings(query({ plan: composite, operatoryId: 100, busy, limit: 1000 }))
    // The other visit holds chair 100 from 09:00 to 10:05 (65 min), every segment of it.
    for (const o of result.openings) expect(o.endMs <= monday('09:00') || o.startMs >= monday('10:05')).toBe(true)
    expect(localTimes(result.openings, LOS_ANGELES).slice(0, 2)).toEqual(['10:05', '10:10'])
  })

  it('keeps the whole chair time inside opening hours and out of blocks', () => {
    const lunch: BlockInput = { id: 1, siteId: 1, operatoryId: 100, providerId: null, date: '2026-01-12', localStart: '12:00', localEnd: '13:00', rrule: null, untilDate: null, reason: 'Handpiece service' }
    const site = makeSite({ blocks: [lunch] })
    const composite = composite19()
    const result = findOpenings(query({ plan: composite, sites: [site], operatoryId: 100, limit: 1000 }))
    const times = localTimes(result.openings, LOS_ANGELES)
    expect(times[0]).toBe('08:00')
    expect(times.at(-1)).toBe('15:55') // 15:55 + 65 min = 17:00, closing time
    expect(times).toContain('10:55') // ends 12:00, as the block starts
    expect(times).not.toContain('11:00')
    expect(times).toContain('13:00')
  })
})

describe('findOpenings: time rules', () => {
  it('puts starts on the site\'s 10-minute grid in local time (Denver)', () => {
    const site = makeSite({ zone: DENVER, unit: 10 })
    // A visit ending at 08:07 Denver time: the next start is 08:10, not 08:07.
    const odd: OpeningsPlan = { chairMinutes: 7, segments: [{ kind: 'assist', startMinute: 0, endMinute: 7 }] }
    const busy = visit(odd, monday('08:00', DENVER), 100, null)
    const result = findOpenings(query({ plan: composite19(10), sites: [site], operatoryId: 100, busy, fromMs: monday('00:00', DENVER), toMs: monday('23:00', DENVER), limit: 1000 }))
    const times = localTimes(result.openings, DENVER)
    expect(times[0]).toBe('08:10')
    expect(times.every((t) => Number(t.slice(3)) % 10 === 0)).toBe(true)
    expect(formatOpening(result.openings[0]!, DENVER)).toEqual({
      startUtc: '2026-01-12T15:10:00.000Z',
      endUtc: '2026-01-12T16:20:00.000Z',
      startLocalIso: '2026-01-12T08:10:00-07:00',
      endLocalIso: '2026-01-12T09:20:00-07:00',
      timeZone: DENVER,
    })
  })

  it('aligns the grid to local time where the offset is not whole hours (Kathmandu, UTC+05:45)', () => {
    const zone = 'Asia/Kathmandu'
    const site = makeSite({ zone, unit: 10 })
    const result = findOpenings(query({ plan: composite19(10), sites: [site], fromMs: monday('00:00', zone), toMs: monday('23:00', zone), limit: 3 }))
    expect(localTimes(result.openings, zone)).toEqual(['08:00', '08:00', '08:10'])
    expect(new Date(result.openings[0]!.startMs).toISOString()).toBe('2026-01-12T02:15:00.000Z')
  })

  it('keeps the minimum notice', () => {
    const result = findOpenings(query({ plan: composite19(), nowMs: monday('07:58'), minimumNoticeMinutes: 120, limit: 1 }))
    // now + 2 h = 09:58, so the first 5-minute start is 10:00.
    expect(localTimes(result.openings, LOS_ANGELES)).toEqual(['10:00'])
  })

  it('filters by part of day in local time', () => {
    const afternoon = findOpenings(query({ plan: composite19(), partOfDay: 'afternoon', limit: 1000 })).openings
    const morning = findOpenings(query({ plan: composite19(), partOfDay: 'morning', limit: 1000 })).openings
    expect(localTimes(afternoon, LOS_ANGELES)[0]).toBe('12:00')
    expect(localTimes(morning, LOS_ANGELES).at(-1)).toBe('11:55')
    expect(morning.length + afternoon.length).toBe(findOpenings(query({ plan: composite19(), limit: 1000 })).openings.length)
  })

  it('rejects a range that ends before it starts', () => {
    expect(() => findOpenings(query({ plan: composite19(), fromMs: monday('10:00'), toMs: monday('09:00') }))).toThrow(/after its start/)
  })
})

describe('findOpenings: ranking', () => {
  const twoDentists = () => makeSite({ providers: [{ id: DENTIST, categories: ['restorative'] }, { id: SECOND_DENTIST, categories: ['restorative'] }] })

  it('lists earliest first, ties by site, chair and provider id', () => {
    const result = findOpenings(query({ plan: composite19(), sites: [twoDentists()], limit: 5 }))
    expect(result.openings.map((o) => `${localTimes([o], LOS_ANGELES)[0]} ${o.operatoryId}/${o.providerId}`)).toEqual([
      '08:00 100/7', '08:00 100/8', '08:00 101/7', '08:00 101/8', '08:05 100/7',
    ])
  })

  it('puts the preferred provider first among equally early starts', () => {
    const result = findOpenings(query({ plan: composite19(), sites: [twoDentists()], preferredProviderId: SECOND_DENTIST, limit: 4 }))
    expect(result.openings.map((o) => `${o.operatoryId}/${o.providerId}`)).toEqual(['100/8', '101/8', '100/7', '101/7'])
  })

  it('puts the preferred site first among equally early starts', () => {
    // 08:00 in Los Angeles (UTC−8) and 09:00 in Phoenix (UTC−7) are the same instant.
    const la = makeSite({ id: 1, operatories: [{ id: 100, capabilities: ['restorative'] }] })
    const phoenix = makeSite({ id: 2, zone: PHOENIX, hours: { ...WEEKDAYS, '1': [{ start: '09:00', end: '17:00' }] }, operatories: [{ id: 200, capabilities: ['restorative'] }], providers: [{ id: SECOND_DENTIST, categories: ['restorative'] }] })
    const plain = findOpenings(query({ plan: composite19(), sites: [la, phoenix], limit: 2 })).openings
    const preferred = findOpenings(query({ plan: composite19(), sites: [la, phoenix], preferredSiteId: 2, limit: 2 })).openings
    expect(plain.map((o) => o.siteId)).toEqual([1, 2])
    expect(preferred.map((o) => o.siteId)).toEqual([2, 1])
    expect(preferred[0]!.startMs).toBe(preferred[1]!.startMs)
  })

  it('with fewestGaps, prefers starts that close gaps between visits in the chair', () => {
    const hour: OpeningsPlan = { chairMinutes: 60, segments: [{ kind: 'hands_on', startMinute: 0, endMinute: 60 }] }
    const busy = [...visit(hour, monday('09:00'), 100, SECOND_DENTIST), ...visit(hour, monday('11:00'), 100, SECOND_DENTIST)]
    const result = findOpenings(query({ plan: hour, operatoryId: 100, busy, fewestGaps: true, limit: 4 }))
    // 10:00 sits between both visits (2 points); 08:00 ends at 09:00 and 12:00 starts at 12:00 (1 each);
    // then the earliest of the rest.
    expect(localTimes(result.openings, LOS_ANGELES)).toEqual(['10:00', '08:00', '12:00', '12:05'])
  })
})

describe('findOpenings: when nothing fits', () => {
  it('says no chair has the equipment', () => {
    const result = findOpenings(query({ plan: plan([{ template: template('CLEAN-ADULT') }]), capability: 'surgical', category: 'hygiene' }))
    expect(result.openings).toEqual([])
    expect(result.reasons).toEqual(['No chair at these sites has the needed equipment (surgical)'])
  })

  it('says no provider who does the procedure is on shift', () => {
    const site = makeSite({ providers: [{ id: DENTIST, categories: ['restorative'], weekdays: [2] }] })
    const result = findOpenings(query({ plan: composite19(), sites: [site] }))
    expect(result.reasons).toEqual([OPENINGS_REASONS.noProviderOnShift])
  })

  it('says outside opening hours when the range is after closing', () => {
    const result = findOpenings(query({ plan: composite19(), fromMs: monday('16:30'), toMs: monday('20:00') }))
    expect(result.reasons).toEqual(['Outside opening hours'])
  })

  it('says too soon when only the notice stands in the way', () => {
    const result = findOpenings(query({ plan: composite19(), fromMs: monday('08:00'), toMs: monday('12:00'), nowMs: monday('08:00'), minimumNoticeMinutes: 24 * 60 }))
    expect(result.reasons).toEqual([OPENINGS_REASONS.tooSoon(24 * 60)])
  })

  it('says every chair is busy, with the provider-free near misses', () => {
    const allDay: OpeningsPlan = { chairMinutes: 9 * 60, segments: [{ kind: 'assist', startMinute: 0, endMinute: 9 * 60 }] }
    const busy = [...visit(allDay, monday('08:00'), 100, null), ...visit(allDay, monday('08:00'), 101, null)]
    const result = findOpenings(query({ plan: composite19(), busy }))
    expect(result.reasons).toEqual(['Every suitable chair is busy'])
    expect(result.nearest?.length).toBe(3)
    expect(result.nearest?.[0]).toMatchObject({ operatoryId: 100, providerId: DENTIST, startMs: monday('08:00'), problem: 'chair_busy' })
  })

  it('says the provider is with other patients, and offers the chair-free near misses', () => {
    const composite = composite19()
    const busy = visit(composite, monday('08:00'), 100, DENTIST)
    const result = findOpenings(query({ plan: composite, operatoryId: 101, providerId: DENTIST, busy, fromMs: monday('08:00'), toMs: monday('08:30') }))
    expect(result.openings).toEqual([])
    expect(result.reasons).toEqual([OPENINGS_REASONS.providerBusyWhenChairFree])
    expect(result.nearest?.map((n) => [localTimes([n as Opening], LOS_ANGELES)[0], n.problem])).toEqual([
      ['08:00', 'provider_busy'], ['08:05', 'provider_busy'], ['08:10', 'provider_busy'],
    ])
    expect(result.nearest?.[0]?.note).toBe('The chair is free but the provider is with another patient')
  })
})

describe('findOpenings: daylight-saving days in Los Angeles', () => {
  // A site open 00:00–04:00 on Sundays, so the changed hour falls inside opening hours.
  const NIGHT: OpeningHours = { '1': [], '2': [], '3': [], '4': [], '5': [], '6': [], '7': [{ start: '00:00', end: '04:00' }] }
  const half: OpeningsPlan = { chairMinutes: 30, segments: [{ kind: 'hands_on', startMinute: 0, endMinute: 30 }] }

  function nightSite(date: string): OpeningsSite {
    return makeSite({
      unit: 15,
      hours: NIGHT,
      operatories: [{ id: 100, capabilities: ['restorative'] }],
      providers: [{ id: DENTIST, categories: ['restorative'], weekdays: [7], start: '00:00', end: '04:00' }],
      fromUtc: `${date}T00:00:00Z`,
      toUtc: `${date}T23:00:00Z`,
    })
  }

  function nightOpenings(date: string): string[] {
    const result = findOpenings(query({ plan: half, sites: [nightSite(date)], fromMs: Date.parse(`${date}T00:00:00Z`), toMs: Date.parse(`${date}T23:00:00Z`), limit: 1000 }))
    return result.openings.map((o) => formatOpening(o, LOS_ANGELES).startLocalIso)
  }

  it('never offers a local time that does not exist on 8 March 2026', () => {
    const starts = nightOpenings('2026-03-08')
    expect(starts.some((s) => s.includes('T02:'))).toBe(false)
    expect(starts).toEqual([
      '2026-03-08T00:00:00-08:00', '2026-03-08T00:15:00-08:00', '2026-03-08T00:30:00-08:00', '2026-03-08T00:45:00-08:00',
      '2026-03-08T01:00:00-08:00', '2026-03-08T01:15:00-08:00', '2026-03-08T01:30:00-08:00', '2026-03-08T01:45:00-08:00',
      '2026-03-08T03:00:00-07:00', '2026-03-08T03:15:00-07:00', '2026-03-08T03:30:00-07:00',
    ])
  })

  it('offers the repeated 01:xx hour twice on 1 November 2026', () => {
    const starts = nightOpenings('2026-11-01')
    expect(starts.length).toBe(19) // five real hours, less the last half hour, every 15 minutes
    for (const minute of ['00', '15', '30', '45']) {
      expect(starts).toContain(`2026-11-01T01:${minute}:00-07:00`)
      expect(starts).toContain(`2026-11-01T01:${minute}:00-08:00`)
    }
    expect(starts.at(-1)).toBe('2026-11-01T03:30:00-08:00')
  })
})
