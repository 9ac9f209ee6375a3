// Openings benchmark: a month of three sites, 12 chairs, 10 providers and about 3,000 booked
// visits; median and p95 milliseconds for the engine and for the brute-force reference, and a
// capacity figure for one dentist with two chairs. Figures only, no assertions.
// Run: npx tsx scripts/bench/openings.bench.ts

import { performance } from 'node:perf_hooks'
import { planVisit } from '../../shared/domain/chair-time'
import { findOpenings } from '../../shared/domain/openings'
import { buildWeeklyRule } from '../../shared/domain/recurrence/build'
import { localToUtcMs } from '../../shared/utils/local-date'
import { expandAvailabilityMs } from '../../shared/domain/rota'
import type { OperatoryCapability, PlanItemInput, TemplateCategory, VisitPlan } from '../../shared/types/chair-time'
import type { BusySegment, Opening, OpeningsPlan, OpeningsQuery, OpeningsSite } from '../../shared/types/openings'
import type { BlockInput, OpeningHours, ShiftInput } from '../../shared/types/rota'
import { DEFAULT_TEMPLATES } from '../../seeds/data/procedure-templates'
import { bruteForceOpenings } from '../../tests/support/openings-brute-force'
import { seededRandom } from '../lib/seeded-random'

const MINUTE_MS = 60_000
const DAY_MS = 86_400_000
const ENGINE_RUNS = 50
const BRUTE_FIRST_RUNS = 20
const BRUTE_ALL_RUNS = 3
const TARGET_VISITS = 3_000
const FROM_UTC = '2026-03-02T00:00:00Z' // Monday; the month crosses the 8 March change in LA and Denver
const DAYS = 30
const UNIT = 10 as const

const random = seededRandom(20260302)
const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)]!

function template(code: string) {
  const found = DEFAULT_TEMPLATES.find((t) => t.code === code)
  if (!found) throw new Error(`No seed template ${code}`)
  return found
}

// ---------------------------------------------------------------- the calendar

// Long days (two shifts of staff in real life) so 3,000 visits leave some room in 12 chairs.
const WEEKDAY = [{ start: '07:00', end: '20:00' }]
const HOURS: OpeningHours = { '1': WEEKDAY, '2': WEEKDAY, '3': WEEKDAY, '4': WEEKDAY, '5': WEEKDAY, '6': [{ start: '08:00', end: '16:00' }], '7': [] }
const DENTIST = ['restorative', 'preventive', 'exam', 'surgical', 'prosthodontic']
const HYGIENIST = ['hygiene', 'preventive']

interface SiteSpec {
  id: number
  zone: string
  chairs: string[][]
  /** providerId → weekdays worked here (ISO 1–6). */
  staff: Array<{ id: number; categories: string[]; weekdays: Array<1 | 2 | 3 | 4 | 5 | 6> }>
}

const SPECS: SiteSpec[] = [
  {
    id: 1, zone: 'America/Los_Angeles',
    chairs: [['restorative', 'imaging'], ['restorative'], ['restorative', 'surgical'], ['hygiene', 'imaging'], ['hygiene']],
    staff: [
      { id: 1, categories: DENTIST, weekdays: [1, 2, 3, 4, 5, 6] }, { id: 2, categories: DENTIST, weekdays: [1, 2, 3, 4, 5] },
      { id: 6, categories: DENTIST, weekdays: [1, 3, 5] }, { id: 7, categories: HYGIENIST, weekdays: [1, 2, 3, 4, 5, 6] },
      { id: 8, categories: HYGIENIST, weekdays: [1, 2, 3, 4, 5] },
    ],
  },
  {
    id: 2, zone: 'America/Denver',
    chairs: [['restorative', 'imaging'], ['restorative'], ['hygiene', 'imaging'], ['hygiene']],
    staff: [
      { id: 3, categories: DENTIST, weekdays: [1, 2, 3, 4, 5, 6] }, { id: 4, categories: DENTIST, weekdays: [1, 2, 3, 4, 5] },
      { id: 9, categories: HYGIENIST, weekdays: [1, 2, 3, 4, 5, 6] },
    ],
  },
  {
    id: 3, zone: 'America/Phoenix',
    chairs: [['restorative', 'imaging'], ['restorative', 'hygiene'], ['hygiene']],
    staff: [
      { id: 5, categories: DENTIST, weekdays: [1, 2, 3, 4, 5, 6] }, { id: 6, categories: DENTIST, weekdays: [2, 4] },
      { id: 10, categories: HYGIENIST, weekdays: [1, 2, 3, 4, 5, 6] },
    ],
  },
]

function buildSite(spec: SiteSpec): OpeningsSite {
  const operatories = spec.chairs.map((capabilities, i) => ({ id: spec.id * 100 + i, siteId: spec.id, active: true, capabilities }))
  const shifts: ShiftInput[] = spec.staff.map((s) => ({
    id: spec.id * 1000 + s.id, providerId: s.id, siteId: spec.id, rrule: buildWeeklyRule({ weekdays: s.weekdays }),
    startDate: '2026-01-05', untilDate: null, localStart: '07:00', localEnd: '20:00',
  }))
  const lunches: BlockInput[] = spec.staff.map((s) => ({
    id: spec.id * 1000 + s.id, siteId: spec.id, operatoryId: null, providerId: s.id, date: '2026-01-05',
    localStart: '12:00', localEnd: '12:30', rrule: buildWeeklyRule({ weekdays: [1, 2, 3, 4, 5] }), untilDate: null, reason: 'Lunch',
  }))
  const availability = expandAvailabilityMs({
    site: { id: spec.id, timeZone: spec.zone, openingHours: HOURS, closedDates: [] },
    operatories, shifts, exceptions: [], blocks: lunches,
    fromUtc: FROM_UTC, toUtc: new Date(Date.parse(FROM_UTC) + (DAYS + 1) * DAY_MS).toISOString(),
  })
  return { id: spec.id, timeZone: spec.zone, bookingUnitMinutes: UNIT, operatories, providers: spec.staff.map((s) => ({ id: s.id, categories: s.categories })), availability }
}

interface Request {
  plan: VisitPlan
  capability: OperatoryCapability
  category: TemplateCategory
}

function request(items: PlanItemInput[]): Request {
  const first = items[0]!.template
  return { plan: planVisit(items, { unitMinutes: UNIT }), capability: first.capability, category: first.category }
}

const FILLING_SURFACES = ['O', 'MO', 'MOD', 'MODB']
const fillings: Request[] = ['3', '14', '19', '30'].flatMap((tooth) => FILLING_SURFACES.map((surfaces) => request([{ template: template('COMP-POST'), tooth, surfaces }])))
const repeat = (count: number, make: () => Request): Request[] => Array.from({ length: count }, make)
// About a quarter fillings (16 kinds), the rest cleanings, emergency exams and sealants: restorative
// chairs (7 of 12) would otherwise fill up before the month's 3,000 visits are placed.
const REQUEST_MIX: Request[] = [
  ...fillings,
  ...repeat(24, () => request([{ template: template('CLEAN-ADULT') }])),
  ...repeat(16, () => request([{ template: template('EXAM-EMER') }])),
  ...repeat(8, () => request([{ template: template('SEAL'), tooth: '30' }])),
]

function segmentsOf(plan: OpeningsPlan, opening: Opening): BusySegment[] {
  return plan.segments.map((s) => ({
    operatoryId: opening.operatoryId, providerId: opening.providerId, kind: s.kind,
    startMs: opening.startMs + s.startMinute * MINUTE_MS, endMs: opening.startMs + s.endMinute * MINUTE_MS,
  }))
}

function baseQuery(sites: OpeningsSite[], req: Request, fromMs: number, toMs: number, busy: BusySegment[]): OpeningsQuery {
  return { plan: req.plan, capability: req.capability, category: req.category, sites, busy, fromMs, toMs, nowMs: fromMs, minimumNoticeMinutes: 0, limit: 1 }
}

/** Books visits with the engine itself, one UTC day at a time (each query sees that day's visits). */
function bookMonth(sites: OpeningsSite[]): { busy: BusySegment[]; booked: number } {
  const start = Date.parse(FROM_UTC)
  const days = Array.from({ length: DAYS }, (_, d) => ({ fromMs: start + d * DAY_MS + 13 * 3_600_000, busy: [] as BusySegment[], full: false }))
  let booked = 0
  for (let attempt = 0; booked < TARGET_VISITS && attempt < TARGET_VISITS * 4; attempt++) {
    const open = days.filter((d) => !d.full)
    if (open.length === 0) break
    const day = pick(open)
    const req = pick(REQUEST_MIX)
    const dayEnd = day.fromMs + 16 * 3_600_000
    // A random earliest time spreads visits over the day; retry from the morning when it is late.
    const from = day.fromMs + Math.floor(random() * 12) * 3_600_000
    const found = findOpenings(baseQuery(sites, req, from, dayEnd, day.busy)).openings[0]
      ?? findOpenings(baseQuery(sites, req, day.fromMs, dayEnd, day.busy)).openings[0]
    if (!found) {
      if (req.plan.chairMinutes <= 40) day.full = true
      continue
    }
    day.busy.push(...segmentsOf(req.plan, found))
    booked++
  }
  return { busy: days.flatMap((d) => d.busy), booked }
}

// ---------------------------------------------------------------- timing

function measure(runs: number, run: () => unknown): { median: number; p95: number } {
  const times: number[] = []
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now()
    run()
    times.push(performance.now() - t0)
  }
  times.sort((a, b) => a - b)
  const at = (q: number) => times[Math.min(times.length - 1, Math.floor(q * times.length))]!
  return { median: at(0.5), p95: at(0.95) }
}

const ms = (value: number) => `${value.toFixed(2)} ms`

// ---------------------------------------------------------------- capacity

/** One dentist, two chairs, one day: book each request at its first opening. */
function capacity(holdWholeChairTime: boolean): number {
  const zone = 'America/Los_Angeles'
  const dayStart = localToUtcMs('2026-03-02', '08:00', zone)
  const dayEnd = localToUtcMs('2026-03-02', '17:00', zone)
  const operatories = [100, 101].map((id) => ({ id, siteId: 1, active: true, capabilities: ['restorative'] }))
  const open = [{ startMs: dayStart, endMs: dayEnd }]
  const site: OpeningsSite = {
    id: 1, timeZone: zone, bookingUnitMinutes: UNIT, operatories, providers: [{ id: 1, categories: DENTIST }],
    availability: { operatories: operatories.map((o) => ({ operatoryId: o.id, intervals: open })), providers: [{ providerId: 1, siteId: 1, intervals: open }], blocks: [] },
  }
  const dayRandom = seededRandom(42)
  const busy: BusySegment[] = []
  let booked = 0
  for (let i = 0; i < 40; i++) {
    const tooth = ['3', '14', '19', '30'][Math.floor(dayRandom() * 4)]!
    const surfaces = FILLING_SURFACES[Math.floor(dayRandom() * 4)]!
    const req = request([{ template: template('COMP-POST'), tooth, surfaces }])
    // Holding the provider for the whole chair time = every segment counts as hands-on.
    const plan: OpeningsPlan = holdWholeChairTime ? { ...req.plan, segments: req.plan.segments.map((s) => ({ ...s, kind: 'hands_on' as const })) } : req.plan
    const found = findOpenings({ ...baseQuery([site], req, dayStart, dayEnd, busy), plan }).openings[0]
    if (!found) continue
    busy.push(...segmentsOf(plan, found))
    booked++
  }
  return booked
}

// ---------------------------------------------------------------- main

function main(): void {
  const sites = SPECS.map(buildSite)
  const t0 = performance.now()
  const { busy, booked } = bookMonth(sites)
  console.log(`Calendar: 3 sites, 12 chairs, 10 providers, ${DAYS} days; ${booked} visits (${busy.length} segments) booked by the engine in ${ms(performance.now() - t0)}`)

  const filling = request([{ template: template('COMP-POST'), tooth: '19', surfaces: 'MO' }])
  const fromMs = Date.parse(FROM_UTC)
  const toMs = fromMs + DAYS * DAY_MS
  const first10: OpeningsQuery = { ...baseQuery(sites, filling, fromMs, toMs, busy), limit: 10 }
  const all: OpeningsQuery = { ...first10, limit: Infinity }
  const allBrute: OpeningsQuery = { ...first10, limit: 1_000_000 }

  for (let i = 0; i < 5; i++) findOpenings(all) // warm-up
  const allCount = findOpenings(all).openings.length
  const engineFirst = measure(ENGINE_RUNS, () => findOpenings(first10))
  const engineAll = measure(ENGINE_RUNS, () => findOpenings(all))
  const engineGaps = measure(ENGINE_RUNS, () => findOpenings({ ...first10, fewestGaps: true }))
  const bruteFirst = measure(BRUTE_FIRST_RUNS, () => bruteForceOpenings(first10))
  const bruteAll = measure(BRUTE_ALL_RUNS, () => bruteForceOpenings(allBrute))
  const bruteList = bruteForceOpenings(allBrute)
  const engineList = findOpenings(all).openings
  const key = (o: Opening) => `${o.siteId}/${o.operatoryId}/${o.providerId}@${o.startMs}-${o.endMs}`
  const same = bruteList.map(key).join() === engineList.map(key).join()

  console.log(`Query: 2-surface posterior composite (tooth 19 MO, ${filling.plan.chairMinutes} min chair), all sites, ${DAYS} days`)
  console.log(`  engine, first 10:        median ${ms(engineFirst.median)}, p95 ${ms(engineFirst.p95)} (${ENGINE_RUNS} runs)`)
  console.log(`  engine, all ${allCount} openings: median ${ms(engineAll.median)}, p95 ${ms(engineAll.p95)} (${ENGINE_RUNS} runs)`)
  console.log(`  engine, first 10 by fewest gaps: median ${ms(engineGaps.median)}, p95 ${ms(engineGaps.p95)}`)
  console.log(`  brute force, first 10:   median ${ms(bruteFirst.median)}, p95 ${ms(bruteFirst.p95)} (${BRUTE_FIRST_RUNS} runs)`)
  console.log(`  brute force, all:        median ${ms(bruteAll.median)}, p95 ${ms(bruteAll.p95)} (${BRUTE_ALL_RUNS} runs)`)
  console.log(`  speed-up (median): first 10 ×${(bruteFirst.median / engineFirst.median).toFixed(1)}, all ×${(bruteAll.median / engineAll.median).toFixed(1)}; same openings: ${same ? 'yes' : 'NO'}`)

  const whole = capacity(true)
  const handsOn = capacity(false)
  console.log('Capacity: one dentist, two chairs, 08:00–17:00, 40 filling requests (1–4 surfaces, upper and lower)')
  console.log(`  provider held for the whole chair time: ${whole} visits`)
  console.log(`  provider held for hands-on only:        ${handsOn} visits (+${handsOn - whole}, ${(((handsOn - whole) / whole) * 100).toFixed(0)}%)`)
}

main()
