// Waitlist matching benchmark (issue 17 §2): one freed hour in a busy restorative chair at a group-scale
// site (5 chairs, 5 providers, a full day of visits), matched against 5,000 open waitlist entries with
// a dozen different plans. Each run does what the server does per freed gap: one engine search per
// distinct plan restricted to the gap (openingsInGap), then every entry's own wishes (matchWaitlist).
// Prints the median and p95 in milliseconds (target: median ≤ 50 ms). Figures only, no assertions.
// Run: npx tsx scripts/bench/waitlist-match.bench.ts
import { performance } from 'node:perf_hooks'
import { planVisit } from '../../shared/domain/chair-time'
import { expandAvailabilityMs } from '../../shared/domain/rota'
import { buildWeeklyRule } from '../../shared/domain/recurrence/build'
import { matchWaitlist, openingsInGap, type FreedGap, type WaitlistCandidate } from '../../shared/domain/waitlist-match'
import type { BusySegment, Opening, OpeningsSite } from '../../shared/types/openings'
import type { OpeningHours, ShiftInput } from '../../shared/types/rota'
import { DEFAULT_TEMPLATES } from '../../seeds/data/procedure-templates'

const RUNS = 40
const ENTRIES = 5_000
const ZONE = 'America/Los_Angeles'
const DAY = '2027-01-12' // a Tuesday
const DAY_START = Date.parse('2027-01-12T15:00:00Z') // 07:00 in Los Angeles
const MINUTE = 60_000
const DENTIST = ['restorative', 'preventive', 'exam', 'surgical', 'prosthodontic']
const HYGIENIST = ['hygiene', 'preventive']

let state = 20270112
const random = () => {
  state = (state + 0x6d2b79f5) >>> 0
  let t = state
  t = Math.imul(t ^ (t >>> 15), t | 1)
  t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
  return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296
}
const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)]!

const WEEKDAY = [{ start: '07:00', end: '20:00' }]
const HOURS: OpeningHours = { '1': WEEKDAY, '2': WEEKDAY, '3': WEEKDAY, '4': WEEKDAY, '5': WEEKDAY, '6': [], '7': [] }
const chairs = [['restorative', 'imaging'], ['restorative'], ['restorative', 'surgical'], ['hygiene', 'imaging'], ['hygiene']]
const staff = [{ id: 1, categories: DENTIST }, { id: 2, categories: DENTIST }, { id: 3, categories: DENTIST }, { id: 4, categories: HYGIENIST }, { id: 5, categories: HYGIENIST }]
const operatories = chairs.map((capabilities, i) => ({ id: 100 + i, siteId: 1, active: true, capabilities }))
const shifts: ShiftInput[] = staff.map((s) => ({ id: s.id, providerId: s.id, siteId: 1, rrule: buildWeeklyRule({ weekdays: [1, 2, 3, 4, 5] }), startDate: '2026-01-05', untilDate: null, localStart: '07:00', localEnd: '20:00' }))
const site: OpeningsSite = {
  id: 1, timeZone: ZONE, bookingUnitMinutes: 10,
  operatories, providers: staff.map((s) => ({ id: s.id, categories: s.categories })),
  availability: expandAvailabilityMs({
    site: { id: 1, timeZone: ZONE, openingHours: HOURS, closedDates: [] }, operatories, shifts, exceptions: [], blocks: [],
    fromUtc: new Date(DAY_START - 12 * 3_600_000).toISOString(), toUtc: new Date(DAY_START + 24 * 3_600_000).toISOString(),
  }),
}

// A full day: every chair booked back to back in 50-minute visits, hands-on for the first 40 minutes,
// except the freed hour at 10:00 in the first chair.
const gap: FreedGap = { siteId: 1, operatoryId: 100, timeZone: ZONE, startMs: DAY_START + 3 * 60 * MINUTE, endMs: DAY_START + 4 * 60 * MINUTE }
const busy: BusySegment[] = []
for (const [index, room] of operatories.entries()) {
  for (let start = DAY_START; start < DAY_START + 13 * 60 * MINUTE; start += 60 * MINUTE) {
    if (room.id === gap.operatoryId && start >= gap.startMs && start < gap.endMs) continue
    busy.push({ operatoryId: room.id, providerId: index + 1, kind: 'hands_on', startMs: start, endMs: start + 40 * MINUTE })
    busy.push({ operatoryId: room.id, providerId: null, kind: 'reset', startMs: start + 40 * MINUTE, endMs: start + 50 * MINUTE })
  }
}
const template = (code: string) => DEFAULT_TEMPLATES.find((t) => t.code === code)!
const planSpecs: Array<{ key: string; code: string; tooth?: string; surfaces?: string }> = [
  { key: 'comp-19-mo', code: 'COMP-POST', tooth: '19', surfaces: 'MO' }, { key: 'comp-30-o', code: 'COMP-POST', tooth: '30', surfaces: 'O' },
  { key: 'comp-3-mod', code: 'COMP-POST', tooth: '3', surfaces: 'MOD' }, { key: 'comp-8-m', code: 'COMP-ANT', tooth: '8', surfaces: 'M' },
  { key: 'seal-14', code: 'SEAL', tooth: '14' }, { key: 'exam-new', code: 'EXAM-NEW' }, { key: 'exam-emer', code: 'EXAM-EMER' },
  { key: 'crown-19', code: 'CROWN-PREP', tooth: '19' }, { key: 'ext-1', code: 'EXT-SIMPLE', tooth: '1' },
  { key: 'clean-adult', code: 'CLEAN-ADULT' }, { key: 'clean-child', code: 'CLEAN-CHILD' }, { key: 'comp-20-do', code: 'COMP-POST', tooth: '20', surfaces: 'DO' },
]
const plans = planSpecs.map((spec) => {
  const t = template(spec.code)
  return { key: spec.key, plan: planVisit([{ template: t, tooth: spec.tooth, surfaces: spec.surfaces }], { unitMinutes: 10 }), capability: t.capability, category: t.category }
})
const entries: WaitlistCandidate[] = Array.from({ length: ENTRIES }, (_, i) => ({
  id: i + 1, siteIds: random() < 0.8 ? [1] : [2, 3], fromDate: random() < 0.9 ? '2027-01-04' : '2027-01-13', toDate: '2027-02-20',
  partOfDay: pick(['any', 'any', 'morning', 'afternoon'] as const), noticeMinutes: pick([0, 60, 120, 240, 1440]),
  priority: 1 + Math.floor(random() * 5), createdAtMs: Date.parse('2026-12-01T00:00:00Z') + i * MINUTE, planKey: pick(plans).key,
}))
const nowMs = DAY_START - 26 * 60 * MINUTE

function once(): number {
  const openingsByPlan = new Map<string, Opening[]>()
  for (const entry of new Set(entries.map((e) => e.planKey))) {
    const p = plans.find((plan) => plan.key === entry)!
    openingsByPlan.set(entry, openingsInGap({ plan: p.plan, capability: p.capability, category: p.category, sites: [site], busy, nowMs, minimumNoticeMinutes: 0 }, gap))
  }
  return matchWaitlist({ gap, entries, openingsByPlan, nowMs }).length
}

const times: number[] = []
let matched = 0
for (let run = 0; run < RUNS + 3; run += 1) {
  const started = performance.now()
  matched = once()
  if (run >= 3) times.push(performance.now() - started)
}
times.sort((a, b) => a - b)
const median = times[Math.floor(times.length / 2)]!
const p95 = times[Math.floor(times.length * 0.95)]!
console.log(`waitlist matching: ${ENTRIES} entries, ${plans.length} plans, one freed hour on ${DAY} (${ZONE}); ${matched} fit`)
console.log(`median ${median.toFixed(1)} ms, p95 ${p95.toFixed(1)} ms over ${RUNS} runs (target: median ≤ 50 ms)`)
