// A small hand-built Openings query for the unit tests of openings-context and openings-reasons:
// one site in UTC (so wall time is UTC time and the grid is plain), a fixed Monday, intervals written
// as 'HH:mm' on that day. Pure functions are handed their "now", so the fixed date is on purpose.
import type { BusySegment, OpeningsQuery, OpeningsSite } from '../../shared/types/openings'
import type { EpochInterval } from '../../shared/types/rota'

const MINUTE_MS = 60_000
/** Monday 5 January 2026, 00:00 UTC. */
const DAY_MS = Date.UTC(2026, 0, 5)

/** 'HH:mm' on the fixture's day as epoch milliseconds. */
export function at(time: string): number {
  const [hours, minutes] = time.split(':').map(Number) as [number, number]
  return DAY_MS + (hours * 60 + minutes) * MINUTE_MS
}

export function span(from: string, to: string): EpochInterval {
  return { startMs: at(from), endMs: at(to) }
}

export const CHAIR = 100
export const HYGIENE_CHAIR = 101
export const RETIRED_CHAIR = 102
export const DENTIST = 7
export const SECOND_DENTIST = 8
export const HYGIENIST = 9

/**
 * A 60-minute filling: hands-on 0–20, numbing wait 20–30 (provider free), hands-on 30–50, room reset
 * 50–60. The provider is needed 0–20 and 30–50; the chair all hour.
 */
export const FILLING_PLAN = {
  chairMinutes: 60,
  segments: [
    { kind: 'hands_on', startMinute: 0, endMinute: 20 },
    { kind: 'numbing', startMinute: 20, endMinute: 30 },
    { kind: 'hands_on', startMinute: 30, endMinute: 50 },
    { kind: 'reset', startMinute: 50, endMinute: 60 },
  ],
} as const

export interface FixtureTimes {
  chairOpen?: EpochInterval[]
  dentistShift?: EpochInterval[]
  secondDentistShift?: EpochInterval[]
}

export function site(times: FixtureTimes = {}): OpeningsSite {
  return {
    id: 1,
    timeZone: 'UTC',
    bookingUnitMinutes: 5,
    operatories: [
      { id: CHAIR, siteId: 1, active: true, capabilities: ['restorative'] },
      { id: HYGIENE_CHAIR, siteId: 1, active: true, capabilities: ['hygiene'] },
      { id: RETIRED_CHAIR, siteId: 1, active: false, capabilities: ['restorative'] },
    ],
    providers: [
      { id: DENTIST, categories: ['restorative'] },
      { id: SECOND_DENTIST, categories: ['restorative'] },
      { id: HYGIENIST, categories: ['preventive'] },
    ],
    availability: {
      operatories: [
        { operatoryId: CHAIR, intervals: times.chairOpen ?? [span('08:00', '12:00')] },
        { operatoryId: HYGIENE_CHAIR, intervals: [span('08:00', '17:00')] },
        { operatoryId: RETIRED_CHAIR, intervals: [span('08:00', '17:00')] },
      ],
      providers: [
        { providerId: DENTIST, siteId: 1, intervals: times.dentistShift ?? [span('08:00', '12:00')] },
        { providerId: SECOND_DENTIST, siteId: 1, intervals: times.secondDentistShift ?? [] },
        { providerId: HYGIENIST, siteId: 1, intervals: [span('08:00', '17:00')] },
      ],
      blocks: [],
    },
  }
}

export function segment(operatoryId: number, providerId: number | null, kind: BusySegment['kind'], from: string, to: string): BusySegment {
  return { operatoryId, providerId, kind, startMs: at(from), endMs: at(to) }
}

/** Openings for the filling on the fixture's day, searched 08:00–17:00, with "now" the day before. */
export function query(overrides: Partial<OpeningsQuery> & { times?: FixtureTimes } = {}): OpeningsQuery {
  const { times, ...rest } = overrides
  return {
    plan: FILLING_PLAN,
    capability: 'restorative',
    category: 'restorative',
    sites: [site(times)],
    busy: [],
    fromMs: at('08:00'),
    toMs: at('17:00'),
    nowMs: DAY_MS - 86_400_000,
    minimumNoticeMinutes: 0,
    ...rest,
  }
}
