// strandReason: whether a booked visit still holds on its site's calendar, and why not, in words.
// Pure: fixed dates are fine here (the function is handed everything, "now" included).
import { describe, expect, it } from 'vitest'
import { strandedHeading, strandReason, type StrandCheck } from '../../../../shared/domain/stranding'
import { localToUtcMs } from '../../../../shared/utils/local-date'
import type { OpeningHours } from '../../../../shared/types/rota'

const ZONE = 'America/Denver'
const DAY = '2030-03-13' // a Wednesday
const HOURS = [{ start: '08:00', end: '17:00' }]
const WEEKDAYS: OpeningHours = { 1: HOURS, 2: HOURS, 3: HOURS, 4: HOURS, 5: HOURS, 6: [], 7: [] }
const at = (time: string) => localToUtcMs(DAY, time, ZONE)

function check(overrides: Partial<StrandCheck> = {}, calendar: Partial<StrandCheck['calendar']> = {}): StrandCheck {
  return {
    calendar: {
      site: { id: 1, timeZone: ZONE, openingHours: WEEKDAYS, closedDates: [] },
      operatories: [{ id: 5, siteId: 1, active: true }],
      shifts: [{ id: 1, providerId: 7, siteId: 1, rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH,FR', startDate: '2030-01-01', untilDate: null, localStart: '08:00', localEnd: '17:00' }],
      exceptions: [],
      blocks: [],
      ...calendar,
    },
    room: { id: 5, name: 'Chair 2', capabilities: ['restorative'], active: true },
    provider: { id: 7, name: 'Dr Vale', capabilities: ['restorative'], active: true },
    needs: [{ name: 'Posterior composite', capability: 'restorative', category: 'restorative' }],
    startMs: at('10:00'), endMs: at('11:00'), handsOn: [{ startMs: at('10:10'), endMs: at('10:50') }],
    ...overrides,
  }
}

describe('strandReason', () => {
  it('is null while the chair, the provider, the hours and the capabilities all hold', () => {
    expect(strandReason(check())).toBeNull()
  })

  it('names a chair out of use or not equipped', () => {
    expect(strandReason(check({ room: { id: 5, name: 'Chair 2', capabilities: ['restorative'], active: false } }))).toBe('Chair 2 is out of use')
    expect(strandReason(check({ room: { id: 5, name: 'Chair 2', capabilities: ['hygiene'], active: true } }))).toBe('Chair 2 is not equipped for restorative (Posterior composite)')
  })

  it('names a provider no longer active or no longer doing the procedure', () => {
    expect(strandReason(check({ provider: { id: 7, name: 'Dr Vale', capabilities: ['restorative'], active: false } }))).toBe('Dr Vale no longer sees patients')
    expect(strandReason(check({ provider: { id: 7, name: 'Dr Vale', capabilities: ['exam'], active: true } }))).toBe('Dr Vale does not do restorative procedures (Posterior composite)')
  })

  it('names a closed date, shorter hours, a site block and a chair block', () => {
    expect(strandReason(check({}, { site: { id: 1, timeZone: ZONE, openingHours: WEEKDAYS, closedDates: [DAY] } }))).toBe(`The site is closed on ${DAY}`)
    const morning = { ...WEEKDAYS, 3: [{ start: '08:00', end: '10:30' }] }
    expect(strandReason(check({}, { site: { id: 1, timeZone: ZONE, openingHours: morning, closedDates: [] } }))).toBe("Outside the site's opening hours")
    const block = { id: 3, siteId: 1, operatoryId: null, providerId: null, date: DAY, localStart: '09:00', localEnd: '10:30', rrule: null, untilDate: null, reason: 'Fire drill' }
    expect(strandReason(check({}, { blocks: [block] }))).toBe('The site is blocked: Fire drill')
    expect(strandReason(check({}, { blocks: [{ ...block, operatoryId: 5, reason: 'Handpiece repair' }] }))).toBe('Chair 2 is blocked: Handpiece repair')
  })

  it('says "away" for time off, never its (possibly medical) reason; names a provider block and a missing shift', () => {
    const timeOff = { id: 9, providerId: 7, kind: 'time_off' as const, siteId: null, startDate: DAY, endDate: DAY, localStart: null, localEnd: null, reason: 'Surgery' }
    expect(strandReason(check({}, { exceptions: [timeOff] }))).toBe('Dr Vale is away')
    const block = { id: 4, siteId: 1, operatoryId: null, providerId: 7, date: DAY, localStart: '10:00', localEnd: '10:30', rrule: null, untilDate: null, reason: 'Training' }
    expect(strandReason(check({}, { blocks: [block] }))).toBe('Dr Vale is blocked: Training')
    expect(strandReason(check({}, { shifts: [] }))).toBe('Dr Vale is not on shift then')
  })

  it('lets the provider be off shift outside the hands-on parts (numbing, assist and reset hold only the chair)', () => {
    const afternoon = [{ id: 1, providerId: 7, siteId: 1, rrule: 'FREQ=DAILY', startDate: '2030-01-01', untilDate: null, localStart: '10:05', localEnd: '17:00' }]
    expect(strandReason(check({}, { shifts: afternoon }))).toBeNull()
  })
})

describe('strandedHeading', () => {
  it('says whom the visits lose, or that they need a new time', () => {
    expect(strandedHeading(3, 'dentist')).toBe('3 booked visits would lose their dentist')
    expect(strandedHeading(1, 'hygienist')).toBe('1 booked visit would lose its hygienist')
    expect(strandedHeading(2)).toBe('2 booked visits would need a new time')
  })
})
