import { describe, expect, it } from 'vitest'
import { buildWeeklyRule } from '../../../../shared/domain/recurrence/build'
import { expandAvailability, expandAvailabilityMs, findFirstShiftClash } from '../../../../shared/domain/rota'
import type {
  BlockInput,
  ExpandAvailabilityInput,
  OpeningHours,
  ShiftExceptionInput,
  ShiftInput,
  SiteCalendar,
  UtcInterval,
} from '../../../../shared/types/rota'

const LOS_ANGELES = 'America/Los_Angeles'
const DENVER = 'America/Denver'
const PHOENIX = 'America/Phoenix'
const NEW_YORK = 'America/New_York'

const EIGHT_TO_FIVE = [{ start: '08:00', end: '17:00' }]
const WEEKDAYS_EIGHT_TO_FIVE: OpeningHours = { '1': EIGHT_TO_FIVE, '2': EIGHT_TO_FIVE, '3': EIGHT_TO_FIVE, '4': EIGHT_TO_FIVE, '5': EIGHT_TO_FIVE, '6': [], '7': [] }

function makeSite(overrides: Partial<SiteCalendar> = {}): SiteCalendar {
  return { id: 1, timeZone: LOS_ANGELES, openingHours: WEEKDAYS_EIGHT_TO_FIVE, closedDates: [], ...overrides }
}

function makeShift(overrides: Partial<ShiftInput> = {}): ShiftInput {
  return {
    id: 10,
    providerId: 7,
    siteId: 1,
    rrule: buildWeeklyRule({ weekdays: [1] }),
    startDate: '2026-01-05',
    untilDate: null,
    localStart: '08:00',
    localEnd: '17:00',
    ...overrides,
  }
}

function makeBlock(overrides: Partial<BlockInput> = {}): BlockInput {
  return { id: 50, siteId: 1, operatoryId: null, providerId: null, date: '2026-03-09', localStart: '12:00', localEnd: '13:00', rrule: null, untilDate: null, reason: 'Lunch', ...overrides }
}

function makeException(overrides: Partial<ShiftExceptionInput> = {}): ShiftExceptionInput {
  return { id: 70, providerId: 7, kind: 'time_off', siteId: null, startDate: '2026-03-09', endDate: '2026-03-09', localStart: null, localEnd: null, ...overrides }
}

function input(overrides: Partial<ExpandAvailabilityInput> = {}): ExpandAvailabilityInput {
  return {
    site: makeSite(),
    operatories: [{ id: 100, siteId: 1, active: true }],
    shifts: [makeShift()],
    exceptions: [],
    blocks: [],
    fromUtc: '2026-03-09T00:00:00Z',
    toUtc: '2026-03-14T00:00:00Z', // Monday 9 to Friday 13 March 2026 (PDT, UTC−07:00)
    ...overrides,
  }
}

const span = (startUtc: string, endUtc: string): UtcInterval => ({ startUtc, endUtc })

function providerIntervals(result: ReturnType<typeof expandAvailability>, providerId = 7): UtcInterval[] {
  return result.providers.find((p) => p.providerId === providerId)?.intervals ?? []
}

function operatoryIntervals(result: ReturnType<typeof expandAvailability>, operatoryId = 100): UtcInterval[] | undefined {
  return result.operatories.find((o) => o.operatoryId === operatoryId)?.intervals
}

describe('expandAvailability: DST 2026 (IANA tz database; US rule 15 U.S.C. §260a)', () => {
  // A weekly Monday 08:00–17:00 shift, before and after 8 March and 1 November 2026.
  const cases = [
    { zone: LOS_ANGELES, winter: ['16:00', '01:00'], summer: ['15:00', '00:00'] }, // −08:00 / −07:00
    { zone: DENVER, winter: ['15:00', '00:00'], summer: ['14:00', '23:00'] }, // −07:00 / −06:00
    { zone: PHOENIX, winter: ['15:00', '00:00'], summer: ['15:00', '00:00'] }, // −07:00 all year
  ]

  /** An 08:00–17:00 interval on `date` whose UTC clock times are [start, end]; an end before the start is the next day. */
  function shiftAt(date: string, [start, end]: string[], nextDate: string): UtcInterval {
    return span(`${date}T${start}:00.000Z`, `${end! < start! ? nextDate : date}T${end}:00.000Z`)
  }

  it.each(cases)('$zone: spring forward moves the UTC times of the same wall-clock shift', ({ zone, winter, summer }) => {
    const result = expandAvailability(input({ site: makeSite({ timeZone: zone }), fromUtc: '2026-03-02T00:00:00Z', toUtc: '2026-03-17T12:00:00Z' }))
    expect(providerIntervals(result)).toEqual([
      shiftAt('2026-03-02', winter, '2026-03-03'),
      shiftAt('2026-03-09', summer, '2026-03-10'),
      shiftAt('2026-03-16', summer, '2026-03-17'),
    ])
  })

  it.each(cases)('$zone: fall back returns to standard-time UTC times', ({ zone, winter, summer }) => {
    const result = expandAvailability(input({ site: makeSite({ timeZone: zone }), fromUtc: '2026-10-26T00:00:00Z', toUtc: '2026-11-10T12:00:00Z' }))
    expect(providerIntervals(result)).toEqual([
      shiftAt('2026-10-26', summer, '2026-10-27'),
      shiftAt('2026-11-02', winter, '2026-11-03'),
      shiftAt('2026-11-09', winter, '2026-11-10'),
    ])
  })

  it('a shift on the change days themselves uses the new offset from 02:00', () => {
    const sundays = makeShift({ rrule: buildWeeklyRule({ weekdays: [7] }), startDate: '2026-03-01' })
    const spring = expandAvailability(input({ shifts: [sundays], fromUtc: '2026-03-08T00:00:00Z', toUtc: '2026-03-09T12:00:00Z' }))
    expect(providerIntervals(spring)).toEqual([span('2026-03-08T15:00:00.000Z', '2026-03-09T00:00:00.000Z')]) // PDT
    const autumn = expandAvailability(input({ shifts: [sundays], fromUtc: '2026-11-01T00:00:00Z', toUtc: '2026-11-02T12:00:00Z' }))
    expect(providerIntervals(autumn)).toEqual([span('2026-11-01T16:00:00.000Z', '2026-11-02T01:00:00.000Z')]) // PST
  })

  it('a chair open 00:00–04:00 offers no nonexistent hour on 8 March and keeps the repeated hour on 1 November', () => {
    const nightOwl = makeSite({ openingHours: { ...WEEKDAYS_EIGHT_TO_FIVE, '7': [{ start: '00:00', end: '04:00' }] } })
    const spring = expandAvailability(input({ site: nightOwl, fromUtc: '2026-03-08T00:00:00Z', toUtc: '2026-03-08T20:00:00Z' }))
    // 00:00 PST = 08:00Z; 04:00 PDT = 11:00Z: three real hours, 02:00–03:00 never offered.
    expect(operatoryIntervals(spring)).toEqual([span('2026-03-08T08:00:00.000Z', '2026-03-08T11:00:00.000Z')])
    const autumn = expandAvailability(input({ site: nightOwl, fromUtc: '2026-11-01T00:00:00Z', toUtc: '2026-11-01T20:00:00Z' }))
    // 00:00 PDT = 07:00Z; 04:00 PST = 12:00Z: five real hours, 01:00–02:00 counted twice.
    expect(operatoryIntervals(autumn)).toEqual([span('2026-11-01T07:00:00.000Z', '2026-11-01T12:00:00.000Z')])
  })
})

describe('expandAvailability: operatories', () => {
  it('opens each active chair for the opening hours of each day', () => {
    const result = expandAvailability(input({ fromUtc: '2026-03-09T00:00:00Z', toUtc: '2026-03-11T00:00:00Z' }))
    expect(result.operatories).toEqual([
      {
        operatoryId: 100,
        intervals: [span('2026-03-09T15:00:00.000Z', '2026-03-10T00:00:00.000Z'), span('2026-03-10T15:00:00.000Z', '2026-03-11T00:00:00.000Z')],
      },
    ])
  })

  it('removes closed dates', () => {
    const result = expandAvailability(input({ site: makeSite({ closedDates: ['2026-03-10'] }), fromUtc: '2026-03-09T00:00:00Z', toUtc: '2026-03-12T00:00:00Z' }))
    expect(operatoryIntervals(result)).toEqual([
      span('2026-03-09T15:00:00.000Z', '2026-03-10T00:00:00.000Z'),
      span('2026-03-11T15:00:00.000Z', '2026-03-12T00:00:00.000Z'),
    ])
  })

  it('omits inactive operatories and other sites’ operatories', () => {
    const result = expandAvailability(input({ operatories: [{ id: 100, siteId: 1, active: false }, { id: 200, siteId: 2, active: true }, { id: 101, siteId: 1, active: true }] }))
    expect(result.operatories.map((o) => o.operatoryId)).toEqual([101])
  })

  it('has no time on a weekday the site is closed', () => {
    const result = expandAvailability(input({ fromUtc: '2026-03-14T00:00:00Z', toUtc: '2026-03-16T00:00:00Z' })) // Saturday, Sunday
    expect(operatoryIntervals(result)).toEqual([])
  })

  it('joins split opening hours only where they touch', () => {
    const split = makeSite({ openingHours: { ...WEEKDAYS_EIGHT_TO_FIVE, '1': [{ start: '08:00', end: '12:00' }, { start: '12:00', end: '13:00' }, { start: '14:00', end: '17:00' }] } })
    const result = expandAvailability(input({ site: split, fromUtc: '2026-03-09T00:00:00Z', toUtc: '2026-03-10T00:00:00Z' }))
    expect(operatoryIntervals(result)).toEqual([span('2026-03-09T15:00:00.000Z', '2026-03-09T20:00:00.000Z'), span('2026-03-09T21:00:00.000Z', '2026-03-10T00:00:00.000Z')])
  })
})

describe('expandAvailability: blocks', () => {
  const monday = { fromUtc: '2026-03-09T00:00:00Z', toUtc: '2026-03-10T00:00:00Z' }
  const morning = span('2026-03-09T15:00:00.000Z', '2026-03-09T19:00:00.000Z') // 08:00–12:00 PDT
  const afternoon = span('2026-03-09T20:00:00.000Z', '2026-03-10T00:00:00.000Z') // 13:00–17:00 PDT
  const fullDay = span('2026-03-09T15:00:00.000Z', '2026-03-10T00:00:00.000Z')

  it('a site-wide block subtracts from every chair and every provider', () => {
    const result = expandAvailability(input({ ...monday, blocks: [makeBlock()] }))
    expect(operatoryIntervals(result)).toEqual([morning, afternoon])
    expect(providerIntervals(result)).toEqual([morning, afternoon])
  })

  it('an operatory block holds only that chair', () => {
    const operatories = [{ id: 100, siteId: 1, active: true }, { id: 101, siteId: 1, active: true }]
    const result = expandAvailability(input({ ...monday, operatories, blocks: [makeBlock({ operatoryId: 100 })] }))
    expect(operatoryIntervals(result, 100)).toEqual([morning, afternoon])
    expect(operatoryIntervals(result, 101)).toEqual([fullDay])
    expect(providerIntervals(result)).toEqual([fullDay])
  })

  it('a provider block holds only that provider', () => {
    const shifts = [makeShift(), makeShift({ id: 11, providerId: 8 })]
    const result = expandAvailability(input({ ...monday, shifts, blocks: [makeBlock({ providerId: 7 })] }))
    expect(providerIntervals(result, 7)).toEqual([morning, afternoon])
    expect(providerIntervals(result, 8)).toEqual([fullDay])
    expect(operatoryIntervals(result)).toEqual([fullDay])
  })

  it('a block naming both a chair and a provider holds both', () => {
    const result = expandAvailability(input({ ...monday, blocks: [makeBlock({ operatoryId: 100, providerId: 7 })] }))
    expect(operatoryIntervals(result)).toEqual([morning, afternoon])
    expect(providerIntervals(result)).toEqual([morning, afternoon])
  })

  it('a recurring block repeats by its rule until its until date, and is listed clipped to the window', () => {
    const lunch = makeBlock({ date: '2026-03-02', rrule: buildWeeklyRule({ weekdays: [1, 3] }), untilDate: '2026-03-11' })
    const result = expandAvailability(input({ blocks: [lunch], fromUtc: '2026-03-09T19:30:00Z', toUtc: '2026-03-14T00:00:00Z' }))
    expect(result.blocks).toEqual([
      { blockId: 50, operatoryId: null, providerId: null, reason: 'Lunch', startUtc: '2026-03-09T19:30:00.000Z', endUtc: '2026-03-09T20:00:00.000Z' },
      { blockId: 50, operatoryId: null, providerId: null, reason: 'Lunch', startUtc: '2026-03-11T19:00:00.000Z', endUtc: '2026-03-11T20:00:00.000Z' },
    ])
  })

  it('ignores blocks of other sites', () => {
    const result = expandAvailability(input({ ...monday, blocks: [makeBlock({ siteId: 2 })] }))
    expect(result.blocks).toEqual([])
    expect(operatoryIntervals(result)).toEqual([fullDay])
  })
})

describe('expandAvailability: providers, time off and extras', () => {
  const week = { fromUtc: '2026-03-09T00:00:00Z', toUtc: '2026-03-21T00:00:00Z' } // Mondays 9 and 16 March
  const mar9 = span('2026-03-09T15:00:00.000Z', '2026-03-10T00:00:00.000Z')
  const mar16 = span('2026-03-16T15:00:00.000Z', '2026-03-17T00:00:00.000Z')

  it('whole-day time off removes that day only', () => {
    const result = expandAvailability(input({ ...week, exceptions: [makeException()] }))
    expect(providerIntervals(result)).toEqual([mar16])
  })

  it('time off with hours removes just those hours', () => {
    const result = expandAvailability(input({ ...week, exceptions: [makeException({ localStart: '08:00', localEnd: '10:30' })] }))
    expect(providerIntervals(result)).toEqual([span('2026-03-09T17:30:00.000Z', '2026-03-10T00:00:00.000Z'), mar16])
  })

  it('time off limited to another site does not apply here; a provider fully off is omitted', () => {
    expect(providerIntervals(expandAvailability(input({ ...week, exceptions: [makeException({ siteId: 2 })] })))).toEqual([mar9, mar16])
    const allOff = expandAvailability(input({ ...week, exceptions: [makeException({ endDate: '2026-03-20' })] }))
    expect(allOff.providers).toEqual([])
  })

  it('an extra shift adds time, including for a provider with no regular shift here', () => {
    const extra = makeException({ id: 71, providerId: 9, kind: 'extra', siteId: 1, startDate: '2026-03-11', endDate: '2026-03-12', localStart: '09:00', localEnd: '12:00' })
    const result = expandAvailability(input({ ...week, exceptions: [extra] }))
    expect(providerIntervals(result, 9)).toEqual([
      span('2026-03-11T16:00:00.000Z', '2026-03-11T19:00:00.000Z'),
      span('2026-03-12T16:00:00.000Z', '2026-03-12T19:00:00.000Z'),
    ])
    expect(result.providers.map((p) => [p.providerId, p.siteId])).toEqual([[7, 1], [9, 1]])
  })

  it('an extra without hours takes the site’s opening hours; an extra at another site is ignored', () => {
    const extraDay = makeException({ kind: 'extra', siteId: 1, startDate: '2026-03-10', endDate: '2026-03-10' })
    const elsewhere = makeException({ id: 72, kind: 'extra', siteId: 2, startDate: '2026-03-11', endDate: '2026-03-11', localStart: '08:00', localEnd: '17:00' })
    const result = expandAvailability(input({ ...week, exceptions: [extraDay, elsewhere] }))
    expect(providerIntervals(result)).toEqual([mar9, span('2026-03-10T15:00:00.000Z', '2026-03-11T00:00:00.000Z'), mar16])
  })

  it('closed dates remove regular shifts but keep a deliberate extra', () => {
    const closedMonday = makeSite({ closedDates: ['2026-03-09', '2026-03-16'] })
    const training = makeException({ kind: 'extra', siteId: 1, startDate: '2026-03-16', endDate: '2026-03-16', localStart: '09:00', localEnd: '11:00' })
    const result = expandAvailability(input({ ...week, site: closedMonday, exceptions: [training] }))
    expect(providerIntervals(result)).toEqual([span('2026-03-16T16:00:00.000Z', '2026-03-16T18:00:00.000Z')])
    expect(operatoryIntervals(result)?.some((i) => i.startUtc.startsWith('2026-03-16'))).toBe(false)
  })

  it('keeps provider time outside opening hours (the openings search intersects with chair time)', () => {
    const early = makeShift({ localStart: '07:00', localEnd: '12:00' })
    const result = expandAvailability(input({ shifts: [early], fromUtc: '2026-03-09T00:00:00Z', toUtc: '2026-03-10T00:00:00Z' }))
    expect(providerIntervals(result)).toEqual([span('2026-03-09T14:00:00.000Z', '2026-03-09T19:00:00.000Z')])
  })

  it('merges touching shifts and ignores shifts at other sites', () => {
    const shifts = [makeShift({ localEnd: '12:00' }), makeShift({ id: 11, localStart: '12:00' }), makeShift({ id: 12, siteId: 2, rrule: buildWeeklyRule({ weekdays: [2] }) })]
    const result = expandAvailability(input({ shifts, fromUtc: '2026-03-09T00:00:00Z', toUtc: '2026-03-11T00:00:00Z' }))
    expect(providerIntervals(result)).toEqual([mar9])
  })

  it('a shift ending at or before its start runs past midnight', () => {
    const overnight = makeShift({ localStart: '22:00', localEnd: '02:00' })
    const result = expandAvailability(input({ shifts: [overnight], fromUtc: '2026-03-09T00:00:00Z', toUtc: '2026-03-11T00:00:00Z' }))
    expect(providerIntervals(result)).toEqual([span('2026-03-10T05:00:00.000Z', '2026-03-10T09:00:00.000Z')])
  })

  it('respects the shift’s start and until dates', () => {
    const result = expandAvailability(input({ ...week, shifts: [makeShift({ startDate: '2026-03-10' })] }))
    expect(providerIntervals(result)).toEqual([mar16])
    expect(expandAvailability(input({ ...week, shifts: [makeShift({ untilDate: '2026-03-15' })] })).providers[0]?.intervals).toEqual([mar9])
  })
})

describe('expandAvailability: window', () => {
  it('clips everything to [fromUtc, toUtc), including an interval that began the local day before', () => {
    const overnight = makeShift({ localStart: '22:00', localEnd: '02:00' })
    const result = expandAvailability(input({ shifts: [overnight], fromUtc: '2026-03-10T07:00:00Z', toUtc: '2026-03-10T16:00:00Z' }))
    expect(providerIntervals(result)).toEqual([span('2026-03-10T07:00:00.000Z', '2026-03-10T09:00:00.000Z')])
    expect(operatoryIntervals(result)).toEqual([span('2026-03-10T15:00:00.000Z', '2026-03-10T16:00:00.000Z')])
  })

  it('returns nothing for an empty or reversed window', () => {
    expect(expandAvailability(input({ fromUtc: '2026-03-10T00:00:00Z', toUtc: '2026-03-10T00:00:00Z' }))).toEqual({ operatories: [], providers: [], blocks: [] })
  })

  it('refuses instants without an offset so the machine zone cannot leak in', () => {
    expect(() => expandAvailability(input({ fromUtc: '2026-03-10T00:00:00' }))).toThrow(RangeError)
  })

  it('the epoch-ms form carries the same instants', () => {
    const ms = expandAvailabilityMs(input({ fromUtc: '2026-03-09T00:00:00Z', toUtc: '2026-03-10T00:00:00Z' }))
    expect(ms.providers[0]?.intervals).toEqual([{ startMs: Date.UTC(2026, 2, 9, 15), endMs: Date.UTC(2026, 2, 10) }])
  })
})

describe('findFirstShiftClash', () => {
  const zones: Record<number, string> = { 1: LOS_ANGELES, 2: LOS_ANGELES, 3: NEW_YORK, 4: DENVER, 5: PHOENIX }
  const zoneOfSite = (siteId: number): string => {
    const zone = zones[siteId]
    if (!zone) throw new Error(`no site ${siteId}`)
    return zone
  }

  it('finds the first date a weekly shift at one site meets an every-other-week shift at another', () => {
    const siteA = makeShift({ id: 1, siteId: 1, startDate: '2026-01-05' })
    const siteB = makeShift({ id: 2, siteId: 2, rrule: buildWeeklyRule({ weekdays: [1], interval: 2 }), startDate: '2026-01-12', localStart: '13:00', localEnd: '18:00' })
    expect(findFirstShiftClash(siteA, [siteB], zoneOfSite)).toEqual({ date: '2026-01-12', otherShiftId: 2, otherSiteId: 2 })
    expect(findFirstShiftClash(siteB, [siteA], zoneOfSite)).toEqual({ date: '2026-01-12', otherShiftId: 1, otherSiteId: 1 })
  })

  it('returns null when the same wall-clock hours never overlap because the zones differ', () => {
    // 08:00–11:00 in Los Angeles is 16:00–19:00Z (PST) / 15:00–18:00Z (PDT);
    // 08:00–11:00 in New York is 13:00–16:00Z (EST) / 12:00–15:00Z (EDT). IANA tz database.
    const west = makeShift({ id: 1, siteId: 1, localStart: '08:00', localEnd: '11:00' })
    const east = makeShift({ id: 2, siteId: 3, localStart: '08:00', localEnd: '11:00' })
    expect(findFirstShiftClash(west, [east], zoneOfSite)).toBeNull()
  })

  it('finds a clash that only daylight saving creates (Denver moves, Phoenix does not)', () => {
    // Phoenix 08:00–12:00 = 15:00–19:00Z all year. Denver 12:00–16:00 = 19:00–23:00Z in MST (touching,
    // no clash) but 18:00–22:00Z in MDT from 8 March 2026. IANA tz database; 15 U.S.C. §260a.
    const phoenix = makeShift({ id: 1, siteId: 5, localStart: '08:00', localEnd: '12:00' })
    const denver = makeShift({ id: 2, siteId: 4, localStart: '12:00', localEnd: '16:00' })
    expect(findFirstShiftClash(phoenix, [denver], zoneOfSite)).toEqual({ date: '2026-03-09', otherShiftId: 2, otherSiteId: 4 })
  })

  it('ignores other providers, the same site and the shift itself, and stops at until dates and the horizon', () => {
    const mine = makeShift({ id: 1, siteId: 1 })
    expect(findFirstShiftClash(mine, [mine, makeShift({ id: 2, siteId: 1 }), makeShift({ id: 3, siteId: 2, providerId: 99 })], zoneOfSite)).toBeNull()
    const ended = makeShift({ id: 4, siteId: 2, untilDate: '2026-01-04' })
    expect(findFirstShiftClash(mine, [ended], zoneOfSite)).toBeNull()
    const later = makeShift({ id: 5, siteId: 2, startDate: '2026-06-01' })
    expect(findFirstShiftClash(mine, [later], zoneOfSite, 100)).toBeNull()
    expect(findFirstShiftClash(mine, [later], zoneOfSite)).toEqual({ date: '2026-06-01', otherShiftId: 5, otherSiteId: 2 })
  })

  it('reports the earliest of several clashing shifts', () => {
    const mine = makeShift({ id: 1, siteId: 1, rrule: buildWeeklyRule({ weekdays: [1, 3] }) })
    const wednesdays = makeShift({ id: 2, siteId: 2, rrule: buildWeeklyRule({ weekdays: [3] }), startDate: '2026-01-07' })
    const mondaysLater = makeShift({ id: 3, siteId: 5, startDate: '2026-02-02' })
    expect(findFirstShiftClash(mine, [mondaysLater, wednesdays], zoneOfSite)).toEqual({ date: '2026-01-07', otherShiftId: 2, otherSiteId: 2 })
  })
})
