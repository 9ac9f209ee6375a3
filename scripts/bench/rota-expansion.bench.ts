// Rota expansion benchmark: 3 sites × 90 days, repeated, printing median and p95 milliseconds.
// Run: npx tsx scripts/bench/rota-expansion.bench.ts
// No assertions; figures only. The window crosses the 8 March 2026 DST change.

import { performance } from 'node:perf_hooks'
import { buildMonthlyNthWeekdayRule, buildWeeklyRule } from '../../shared/domain/recurrence/build'
import { expandAvailabilityMs, findFirstShiftClash } from '../../shared/domain/rota'
import type {
  BlockInput,
  ExpandAvailabilityInput,
  OpeningHours,
  OperatoryInput,
  ShiftExceptionInput,
  ShiftInput,
  SiteCalendar,
} from '../../shared/types/rota'

const ROUNDS = 200
const WARM_UP_ROUNDS = 20
const OPERATORIES_PER_SITE = 5
const PROVIDERS_PER_SITE = 4
const ZONES = ['America/Los_Angeles', 'America/Denver', 'America/Phoenix'] as const

const weekdayHours: OpeningHours = {
  '1': [{ start: '07:30', end: '17:30' }],
  '2': [{ start: '07:30', end: '17:30' }],
  '3': [{ start: '07:30', end: '12:00' }, { start: '13:00', end: '19:00' }],
  '4': [{ start: '07:30', end: '17:30' }],
  '5': [{ start: '08:00', end: '15:00' }],
  '6': [{ start: '09:00', end: '13:00' }],
  '7': [],
}

function makeSite(index: number): SiteCalendar {
  return { id: index + 1, timeZone: ZONES[index]!, openingHours: weekdayHours, closedDates: ['2026-04-03', '2026-05-25'] }
}

function makeOperatories(siteId: number): OperatoryInput[] {
  return Array.from({ length: OPERATORIES_PER_SITE }, (_, i) => ({ id: siteId * 100 + i, siteId, active: i !== 4 }))
}

function makeShifts(siteId: number): ShiftInput[] {
  return Array.from({ length: PROVIDERS_PER_SITE }, (_, i) => {
    const providerId = siteId * 10 + i
    const common = { providerId, siteId, startDate: '2025-09-01', untilDate: null }
    return [
      { ...common, id: providerId * 10, rrule: buildWeeklyRule({ weekdays: [1, 3, 5] }), localStart: '08:00', localEnd: '17:00' },
      { ...common, id: providerId * 10 + 1, rrule: buildWeeklyRule({ weekdays: [2, 4], interval: 2 }), localStart: '07:00', localEnd: '15:30' },
    ]
  }).flat()
}

function makeExceptions(siteId: number): ShiftExceptionInput[] {
  const providerId = siteId * 10
  return [
    { id: siteId * 1000, providerId, kind: 'time_off', siteId: null, startDate: '2026-03-16', endDate: '2026-03-20', localStart: null, localEnd: null },
    { id: siteId * 1000 + 1, providerId: providerId + 1, kind: 'time_off', siteId, startDate: '2026-04-07', endDate: '2026-04-07', localStart: '12:00', localEnd: '17:00' },
    { id: siteId * 1000 + 2, providerId: providerId + 2, kind: 'extra', siteId, startDate: '2026-04-11', endDate: '2026-04-11', localStart: '09:00', localEnd: '13:00' },
  ]
}

function makeBlocks(siteId: number): BlockInput[] {
  const base = { siteId, untilDate: null }
  return [
    { ...base, id: siteId * 100, operatoryId: null, providerId: null, date: '2025-09-01', localStart: '12:00', localEnd: '12:30', rrule: buildWeeklyRule({ weekdays: [1, 2, 4] }), reason: 'Lunch' },
    { ...base, id: siteId * 100 + 1, operatoryId: siteId * 100, providerId: null, date: '2025-09-01', localStart: '07:30', localEnd: '09:00', rrule: buildMonthlyNthWeekdayRule({ nth: 1, weekday: 2 }), reason: 'Equipment service' },
    { ...base, id: siteId * 100 + 2, operatoryId: null, providerId: siteId * 10 + 3, date: '2025-09-05', localStart: '14:00', localEnd: '15:00', rrule: buildWeeklyRule({ weekdays: [5], interval: 2 }), reason: 'Study club' },
    { ...base, id: siteId * 100 + 3, operatoryId: siteId * 100 + 1, providerId: null, date: '2026-04-15', localStart: '10:00', localEnd: '11:30', rrule: null, reason: 'Handpiece repair' },
  ]
}

function makeInputs(): ExpandAvailabilityInput[] {
  return ZONES.map((_, index) => {
    const site = makeSite(index)
    return {
      site,
      operatories: makeOperatories(site.id),
      shifts: makeShifts(site.id),
      exceptions: makeExceptions(site.id),
      blocks: makeBlocks(site.id),
      fromUtc: '2026-03-01T00:00:00Z',
      toUtc: '2026-05-30T00:00:00Z',
    }
  })
}

function timeOnce(work: () => void): number {
  const start = performance.now()
  work()
  return performance.now() - start
}

function percentile(sorted: readonly number[], fraction: number): number {
  return sorted[Math.min(sorted.length - 1, Math.ceil(fraction * sorted.length) - 1)]!
}

function report(label: string, work: () => void): void {
  const cold = timeOnce(work)
  for (let i = 0; i < WARM_UP_ROUNDS; i++) work()
  const samples = Array.from({ length: ROUNDS }, () => timeOnce(work)).sort((a, b) => a - b)
  const fmt = (ms: number): string => ms.toFixed(3)
  console.log(`${label}: first run ${fmt(cold)} ms; median ${fmt(percentile(samples, 0.5))} ms; p95 ${fmt(percentile(samples, 0.95))} ms (${ROUNDS} rounds)`)
}

const inputs = makeInputs()
let intervalCount = 0
report('expand 3 sites × 90 days', () => {
  intervalCount = 0
  for (const input of inputs) {
    const result = expandAvailabilityMs(input)
    for (const o of result.operatories) intervalCount += o.intervals.length
    for (const p of result.providers) intervalCount += p.intervals.length
  }
})
console.log(`  (${intervalCount} operatory + provider intervals per round)`)

// A provider working at two sites: Monday/Wednesday/Friday in Los Angeles, checked against Phoenix.
const zoneOfSite = (siteId: number): string => ZONES[siteId - 1]!
const candidate: ShiftInput = { id: 9001, providerId: 77, siteId: 1, rrule: buildWeeklyRule({ weekdays: [1, 3, 5] }), startDate: '2026-01-05', untilDate: null, localStart: '08:00', localEnd: '12:00' }
const others: ShiftInput[] = [
  { id: 9002, providerId: 77, siteId: 3, rrule: buildWeeklyRule({ weekdays: [2, 4] }), startDate: '2026-01-06', untilDate: null, localStart: '08:00', localEnd: '17:00' },
  { id: 9003, providerId: 77, siteId: 2, rrule: buildMonthlyNthWeekdayRule({ nth: -1, weekday: 5 }), startDate: '2026-01-01', untilDate: null, localStart: '14:00', localEnd: '18:00' },
]
let clashDate = 'none'
report('shift clash check, 730-day horizon', () => {
  clashDate = findFirstShiftClash(candidate, others, zoneOfSite)?.date ?? 'none'
})
console.log(`  (first clash: ${clashDate}; 'none' means the whole horizon was scanned, the worst case)`)
