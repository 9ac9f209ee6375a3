// A group at scale for the benchmarks (issue 19 §3): 60 sites, 400 chairs, 250 providers and
// 500,000 visits over a year around today, placed by the same openings engine and chair-time
// templates the demo books with (shared/domain/openings.ts, planVisit on the seeded templates),
// then written straight to the database in multi-row inserts. Its own database (cuspline_groupscale
// by default), made once and kept while its fingerprint matches (same spec, same week), so a rerun
// of `npm run bench` reuses it in seconds.
//
// Past visits are finished or (8 %) missed, later ones booked; a missed visit keeps no segments, as
// after the state API. Nothing overlaps: each site-day's visits are placed by findOpenings against that day's segments
// (providers work at one site only, so a site-day holds all of a provider's segments that day), and a
// patient is booked at most once a day (each patient belongs to one site's list).
import { performance } from 'node:perf_hooks'
import type { Knex } from 'knex'
import { DateTime } from 'luxon'
import mysql from 'mysql2/promise'
import { createDb, dbSettingsFromEnv } from '../../db/connection'
import { migratorConfig } from '../../db/migration-source'
import { hashPasswordOutsideServer } from '../../db/password-hash'
import { DEFAULT_TEMPLATES } from '../../seeds/data/procedure-templates'
import { insertFirstVersion, listCurrentTemplates } from '../../server/repositories/templates'
import { planVisit } from '../../shared/domain/chair-time'
import { findOpenings } from '../../shared/domain/openings'
import { expandAvailabilityMs } from '../../shared/domain/rota'
import type { BookingUnitMinutes, OperatoryCapability, TemplateCategory, VisitPlan } from '../../shared/types/chair-time'
import type { BusySegment, OpeningsSite } from '../../shared/types/openings'
import type { BlockInput, OpeningHours, ShiftInput } from '../../shared/types/rota'
import type { StoredTemplate } from '../../shared/types/templates'
import { seededRandom } from './seeded-random'

export const GROUP = { sites: 60, chairs: 400, providers: 250, visits: 500_000, patients: 120_000, regions: 12 } as const
const GENERATOR_VERSION = 3
export const GROUP_ADMIN = { email: 'admin@fernhollow.test', password: 'cuspline-demo' }
const ZONES = ['America/New_York', 'America/Chicago', 'America/Denver', 'America/Phoenix', 'America/Los_Angeles', 'America/Chicago']
const DAY_MS = 86_400_000
const MINUTE_MS = 60_000


/** The first day of the generated year: the Monday 26 weeks before this week's (UTC). */
export function groupYearStart(now = DateTime.utc()): string {
  return now.startOf('week').minus({ weeks: 26 }).toISODate()!
}

function fingerprintOf(firstDay: string): string {
  return JSON.stringify({ v: GENERATOR_VERSION, ...GROUP, firstDay })
}

// ---------------------------------------------------------------- the group's shape

const weekday = (start: string, end: string) => [{ start, end }]
const CHAIR = ['restorative', 'surgical', 'imaging', 'pediatric']
const HYGIENE_ROOM = ['hygiene', 'pediatric']
const DENTIST = ['restorative', 'exam', 'surgical', 'prosthodontic', 'preventive']
const HYGIENIST = ['hygiene', 'preventive']

export interface GroupSiteSpec {
  index: number
  slug: string
  name: string
  region: number
  zone: string
  unit: BookingUnitMinutes
  hours: OpeningHours
  chairs: Array<{ name: string; capabilities: string[] }>
  staff: Array<{ kind: 'dentist' | 'hygienist'; rrule: string; start: string; end: string }>
  /** Busy in town, quieter out of it: Balance has an imbalance to show. */
  load: number
}

export function groupSiteSpecs(): GroupSiteSpec[] {
  return Array.from({ length: GROUP.sites }, (_, index) => {
    const region = Math.floor(index / (GROUP.sites / GROUP.regions))
    const saturday = index % 2 === 0
    const chairs = index < 40 ? 7 : 6 // 40 × 7 + 20 × 6 = 400
    const hygieneRooms = index < 40 ? 3 : 2
    const dentists = index < 30 ? 3 : 2 // 150
    const hygienists = index < 40 ? 2 : 1 // 100
    const dentistShifts = [
      { rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH,FR', start: '07:00', end: '15:30' },
      { rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH,FR', start: '10:30', end: '19:00' },
      { rrule: saturday ? 'FREQ=WEEKLY;BYDAY=TU,WE,TH,FR,SA' : 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH', start: '08:00', end: '16:30' },
    ]
    const hygienistShifts = [
      { rrule: saturday ? 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH,FR,SA' : 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH,FR', start: '07:00', end: '15:00' },
      { rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH,FR', start: '11:00', end: '19:00' },
    ]
    return {
      index, region,
      slug: `group-${String(index + 1).padStart(2, '0')}`,
      name: `Fernhollow Group Site ${index + 1}`,
      zone: ZONES[region % ZONES.length]!,
      unit: ([5, 10, 15] as const)[index % 3]!,
      hours: { 1: weekday('07:00', '19:00'), 2: weekday('07:00', '19:00'), 3: weekday('07:00', '19:00'), 4: weekday('07:00', '19:00'), 5: weekday('07:00', '17:00'), 6: saturday ? weekday('08:00', '14:00') : [], 7: [] },
      chairs: Array.from({ length: chairs }, (_, chair) => chair < chairs - hygieneRooms
        ? { name: `Chair ${chair + 1}`, capabilities: CHAIR }
        : { name: `Hygiene ${String.fromCharCode(65 + chair - (chairs - hygieneRooms))}`, capabilities: HYGIENE_ROOM }),
      staff: [
        ...dentistShifts.slice(0, dentists).map((shift) => ({ kind: 'dentist' as const, ...shift })),
        ...hygienistShifts.slice(0, hygienists).map((shift) => ({ kind: 'hygienist' as const, ...shift })),
      ],
      load: 0.75 + 0.5 * ((index * 7) % 11) / 10,
    }
  })
}

/** Visit kinds, weighted as the demo's (scripts/seed-demo-visits.ts). */
const MIX: Array<{ weight: number; items: (r: () => number) => Array<{ code: string; tooth?: string; surfaces?: string }> }> = [
  { weight: 5, items: (r) => [{ code: 'COMP-POST', tooth: pickOf(r, ['3', '14', '19', '30', '4', '13', '20', '29']), surfaces: pickOf(r, ['O', 'MO', 'DO', 'MOD', 'MODB']) }] },
  { weight: 2, items: (r) => [{ code: 'COMP-ANT', tooth: pickOf(r, ['7', '8', '9', '10', '23', '26']), surfaces: pickOf(r, ['M', 'D', 'MI', 'DF']) }] },
  { weight: 5, items: () => [{ code: 'CLEAN-ADULT' }] },
  { weight: 1, items: () => [{ code: 'CLEAN-CHILD' }] },
  { weight: 2, items: () => [{ code: 'EXAM-NEW' }] },
  { weight: 1, items: () => [{ code: 'EXAM-EMER' }] },
  { weight: 1, items: (r) => [{ code: 'SEAL', tooth: pickOf(r, ['3', '14', '19', '30']) }] },
  { weight: 1, items: (r) => [{ code: 'EXT-SIMPLE', tooth: pickOf(r, ['1', '16', '17', '32']) }] },
]
const MIX_TOTAL = MIX.reduce((sum, entry) => sum + entry.weight, 0)

function pickOf<T>(random: () => number, list: readonly T[]): T {
  return list[Math.floor(random() * list.length)]!
}

interface Request { plan: VisitPlan; planJson: string; capability: OperatoryCapability; category: TemplateCategory }

/** Plans are built once per distinct request and unit (planVisit on the stored templates). */
function requestMaker(templates: Map<string, StoredTemplate>) {
  const cache = new Map<string, Request>()
  return (random: () => number, unit: BookingUnitMinutes): Request => {
    let roll = random() * MIX_TOTAL
    const entry = MIX.find((candidate) => (roll -= candidate.weight) < 0) ?? MIX[0]!
    const items = entry.items(random)
    const key = `${unit}|${JSON.stringify(items)}`
    let made = cache.get(key)
    if (!made) {
      const plan = planVisit(items.map((item) => ({ template: templates.get(item.code)!, tooth: item.tooth, surfaces: item.surfaces })), { unitMinutes: unit })
      const first = templates.get(items[0]!.code)!
      made = { plan, planJson: JSON.stringify(plan), capability: first.capability, category: first.category }
      cache.set(key, made)
    }
    return made
  }
}

// ---------------------------------------------------------------- the database

export interface GroupScale {
  db: Knex
  database: string
  firstDay: string
  sites: Array<{ id: number; slug: string; region: number; zone: string }>
  /** How it was obtained: built now (with its time) or reused. */
  built: { seconds: number } | 'reused'
}

/** Keeps the database if its fingerprint matches; otherwise builds it (a few minutes). */
export async function groupScaleDatabase(options: { database?: string; adminDatabase: string; poolMax?: number; log?: (line: string) => void }): Promise<GroupScale> {
  const database = options.database ?? 'cuspline_groupscale'
  const log = options.log ?? ((line: string) => console.log(line))
  const firstDay = groupYearStart()
  const fingerprint = fingerprintOf(firstDay)
  const admin = createDb({ ...dbSettingsFromEnv(), database: options.adminDatabase })
  const [rows] = await admin.raw('SELECT SCHEMA_NAME AS name FROM information_schema.SCHEMATA WHERE SCHEMA_NAME = ?', [database]) as [Array<{ name: string }>]
  let reuse = false
  if (rows.length > 0) {
    const [found] = await admin.raw(`SELECT TABLE_NAME FROM information_schema.TABLES WHERE TABLE_SCHEMA = ? AND TABLE_NAME = 'groupscale_fingerprint'`, [database]) as [unknown[]]
    if (found.length > 0) {
      const [stored] = await admin.raw(`SELECT fingerprint FROM \`${database}\`.groupscale_fingerprint`) as [Array<{ fingerprint: string }>]
      reuse = stored[0]?.fingerprint === fingerprint
    }
  }
  let built: GroupScale['built'] = 'reused'
  if (!reuse) {
    const t0 = performance.now()
    await admin.raw(`DROP DATABASE IF EXISTS \`${database}\``)
    await admin.raw(`CREATE DATABASE \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`)
    await admin.destroy()
    await buildGroup(database, firstDay, fingerprint, log)
    built = { seconds: (performance.now() - t0) / 1000 }
  } else {
    await admin.destroy()
  }
  const db = createDb({ ...dbSettingsFromEnv(), database, poolMax: options.poolMax })
  // A kept group gets the migrations added since it was built (an index, say), like any database.
  if (built === 'reused') await db.migrate.latest(migratorConfig)
  const sites = (await db('sites').where('slug', 'like', 'group-%').orderBy('id').select('id', 'slug', 'time_zone')).map((site) => {
    const spec = groupSiteSpecs().find((candidate) => candidate.slug === site.slug)!
    return { id: site.id as number, slug: site.slug as string, region: spec.region, zone: site.time_zone as string }
  })
  return { db, database, firstDay, sites, built }
}

async function buildGroup(database: string, firstDay: string, fingerprint: string, log: (line: string) => void): Promise<void> {
  const settings = dbSettingsFromEnv()
  const db = createDb({ ...settings, database })
  await db.migrate.latest(migratorConfig)
  for (const template of DEFAULT_TEMPLATES) await insertFirstVersion(db, template, null)
  const templates = new Map((await listCurrentTemplates(db)).map((template) => [template.code, template]))
  const [adminId] = await db('users').insert({ email: GROUP_ADMIN.email, name: 'Group Admin', role: 'admin', all_sites: true, password_hash: await hashPasswordOutsideServer(GROUP_ADMIN.password) })
  const specs = groupSiteSpecs()
  const random = seededRandom(20261202)

  // Sites, chairs, providers (one user each), shifts, the lunch block: a few hundred rows, through Knex.
  const built: Array<{ spec: GroupSiteSpec; site: OpeningsSite; id: number; shifts: ShiftInput[]; blocks: BlockInput[] }> = []
  for (const spec of specs) {
    const [siteId] = await db('sites').insert({
      slug: spec.slug, name: spec.name, time_zone: spec.zone, booking_unit_minutes: spec.unit, opening_hours: JSON.stringify(spec.hours),
      closed_dates: '[]', settings: JSON.stringify({ reminderOffsetsHours: [48, 3], minimumNoticeMinutes: 0 }),
      email: `${spec.slug}@fernhollow.test`,
    }) as number[]
    await db('user_sites').insert({ user_id: adminId, site_id: siteId })
    const operatories = []
    for (const [order, chair] of spec.chairs.entries()) {
      const [operatoryId] = await db('operatories').insert({ site_id: siteId, name: chair.name, capabilities: JSON.stringify(chair.capabilities), sort_order: order + 1 }) as number[]
      operatories.push({ id: operatoryId!, siteId: siteId!, active: true, capabilities: chair.capabilities })
    }
    const providers = []
    const shifts: ShiftInput[] = []
    for (const [number, person] of spec.staff.entries()) {
      const [userId] = await db('users').insert({ email: `${person.kind}.${number + 1}.${spec.slug}@fernhollow.test`, name: `${person.kind === 'dentist' ? 'Dr. ' : ''}Group ${spec.index + 1}-${number + 1}`, role: person.kind, password_hash: 'x' }) as number[]
      await db('user_sites').insert({ user_id: userId, site_id: siteId })
      const [providerId] = await db('providers').insert({ user_id: userId, capabilities: JSON.stringify(person.kind === 'dentist' ? DENTIST : HYGIENIST) }) as number[]
      const [shiftId] = await db('shifts').insert({ provider_id: providerId, site_id: siteId, rrule: person.rrule, valid_from: firstDay, local_start: person.start, local_end: person.end }) as number[]
      providers.push({ id: providerId!, categories: person.kind === 'dentist' ? DENTIST : HYGIENIST })
      shifts.push({ id: shiftId!, providerId: providerId!, siteId: siteId!, rrule: person.rrule, startDate: firstDay, untilDate: null, localStart: person.start, localEnd: person.end })
    }
    const [blockId] = await db('blocks').insert({ site_id: siteId, start_date: firstDay, local_start: '12:30', local_end: '13:00', rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH,FR', reason: 'Lunch' }) as number[]
    const blocks: BlockInput[] = [{ id: blockId!, siteId: siteId!, operatoryId: null, providerId: null, date: firstDay, localStart: '12:30', localEnd: '13:00', rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH,FR', untilDate: null, reason: 'Lunch' }]
    built.push({ spec, id: siteId!, shifts, blocks, site: { id: siteId!, timeZone: spec.zone, bookingUnitMinutes: spec.unit, operatories, providers, availability: { operatories: [], providers: [], blocks: [] } } })
  }
  await db.destroy()
  log(`group scale: ${specs.length} sites, ${built.reduce((n, b) => n + b.site.operatories.length, 0)} chairs, ${built.reduce((n, b) => n + b.site.providers.length, 0)} providers created`)

  const connection = await mysql.createConnection({ host: settings.host, port: Number(settings.port), user: settings.user, password: settings.password, database, timezone: 'Z', charset: 'utf8mb4' })
  await connection.query("SET time_zone = '+00:00', foreign_key_checks = 0, unique_checks = 0")
  const insert = async (table: string, columns: string[], rows: unknown[][]) => {
    for (let at = 0; at < rows.length; at += 2_000) {
      await connection.query(`INSERT INTO ${table} (${columns.join(', ')}) VALUES ?`, [rows.slice(at, at + 2_000)])
    }
  }

  // Patients: each belongs to one site's list (preferred site), so a site-day's own set keeps them single-booked.
  const FIRST = ['Ari', 'Bea', 'Cal', 'Dara', 'Eli', 'Fen', 'Gil', 'Hana', 'Ivo', 'Jun', 'Kit', 'Lio', 'Mira', 'Nel', 'Oda', 'Pim', 'Rue', 'Sol', 'Tam', 'Uma', 'Vel', 'Wren', 'Yael', 'Zev']
  const LAST = ['Ashdown', 'Brackley', 'Corrow', 'Dunmere', 'Elstow', 'Farrowby', 'Gorsedge', 'Hollin', 'Inchley', 'Jessop', 'Kestle', 'Larchmont', 'Mossford', 'Netherby', 'Oakhurst', 'Pellow', 'Quillan', 'Rowan', 'Stoke', 'Thistleby']
  const patientsPerSite = GROUP.patients / GROUP.sites
  const patientRows: unknown[][] = []
  for (let id = 1; id <= GROUP.patients; id += 1) {
    const birth = DateTime.utc(1940, 1, 1).plus({ days: Math.floor(random() * 30_000) }).toISODate()
    patientRows.push([id, pickOf(random, FIRST), `${pickOf(random, LAST)}-${id}`, birth, built[Math.floor((id - 1) / patientsPerSite)]!.id])
  }
  await connection.query('BEGIN')
  await insert('patients', ['id', 'first_name', 'last_name', 'date_of_birth', 'preferred_site_id'], patientRows)
  await connection.query('COMMIT')

  // Visits: site by site, week by week, day by day through the engine; written per site.
  const makeRequest = requestMaker(templates)
  const yearStartMs = Date.parse(`${firstDay}T00:00:00Z`)
  const nowMs = Date.now()
  let visitId = 0
  let segmentId = 0
  let placed = 0
  let engineMs = 0
  let writeMs = 0
  // The smaller sites first: what one cannot take passes on to the sites after it, the larger last.
  const order = [...built.keys()].reverse()
  for (const [step, siteIndex] of order.entries()) {
    const entry = built[siteIndex]!
    const t0 = performance.now()
    // This site's share of what is still to place, spread over its open days.
    const share = (GROUP.visits - placed) * entry.spec.load / order.slice(step).reduce((sum, index) => sum + specs[index]!.load, 0)
    const days: Array<{ startMs: number; endMs: number; site: OpeningsSite; busy: BusySegment[]; patients: Set<number>; full: boolean; count: number; misses: number }> = []
    for (let week = 0; week < 52; week += 1) {
      const weekFrom = yearStartMs + week * 7 * DAY_MS
      const availability = expandAvailabilityMs({
        site: { id: entry.id, timeZone: entry.spec.zone, openingHours: entry.spec.hours, closedDates: [] },
        operatories: entry.site.operatories.map((o) => ({ ...o, capabilities: [...o.capabilities] })), shifts: entry.shifts, exceptions: [], blocks: entry.blocks,
        fromUtc: new Date(weekFrom - DAY_MS).toISOString(), toUtc: new Date(weekFrom + 8 * DAY_MS).toISOString(),
      })
      const site: OpeningsSite = { ...entry.site, availability }
      for (let day = 0; day < 7; day += 1) {
        const local = DateTime.fromMillis(weekFrom + day * DAY_MS, { zone: 'UTC' }).toISODate()!
        const startMs = DateTime.fromISO(local, { zone: entry.spec.zone }).toMillis()
        if ((entry.spec.hours as Record<string, unknown[]>)[String(DateTime.fromISO(local).weekday)]!.length === 0) continue
        days.push({ startMs, endMs: startMs + DAY_MS, site, busy: [], patients: new Set(), full: false, count: 0, misses: 0 })
      }
    }
    const target = Math.round(share)
    const pool = { first: siteIndex * patientsPerSite + 1, size: patientsPerSite }
    const visitRows: unknown[][] = []
    const segmentRows: unknown[][] = []
    let siteVisits = 0
    let misses = 0
    while (siteVisits < target && misses < target) {
      const open = days.filter((day) => !day.full)
      if (open.length === 0) break
      // The emptiest days first, so the load spreads evenly over the year.
      const day = open.reduce((least, candidate) => (candidate.count < least.count ? candidate : least), open[Math.floor(random() * open.length)]!)
      const request = makeRequest(random, entry.spec.unit)
      const from = day.startMs + Math.floor(random() * 10) * 3_600_000
      const query = { plan: request.plan, capability: request.capability, category: request.category, sites: [day.site], busy: day.busy, toMs: day.endMs, nowMs: day.startMs, minimumNoticeMinutes: 0, limit: 1 }
      const found = findOpenings({ ...query, fromMs: from }).openings[0] ?? findOpenings({ ...query, fromMs: day.startMs }).openings[0]
      if (!found) {
        misses += 1
        // A day that takes neither a short visit nor four in a row is full: the emptiest day would
        // otherwise be chosen again and again.
        day.misses += 1
        if (request.plan.chairMinutes <= 40 || day.misses >= 4) day.full = true
        continue
      }
      day.misses = 0
      let patientId = pool.first + Math.floor(random() * pool.size)
      while (day.patients.has(patientId)) patientId = pool.first + Math.floor(random() * pool.size)
      day.patients.add(patientId)
      visitId += 1
      const endMs = found.startMs + request.plan.chairMinutes * MINUTE_MS
      const state = endMs <= nowMs ? (random() < 0.08 ? 'missed' : 'finished') : 'booked'
      visitRows.push([visitId, entry.id, found.operatoryId, found.providerId, patientId, new Date(found.startMs), new Date(endMs), state, request.planJson, `gs-${visitId}@cuspline`])
      for (const segment of request.plan.segments) {
        const placedSegment = { operatoryId: found.operatoryId, providerId: found.providerId, kind: segment.kind, startMs: found.startMs + segment.startMinute * MINUTE_MS, endMs: found.startMs + segment.endMinute * MINUTE_MS }
        day.busy.push(placedSegment)
        // A missed visit gave its chair and provider back (changeVisitState keeps no segments for it).
        if (state === 'missed') continue
        segmentId += 1
        segmentRows.push([segmentId, visitId, segment.kind, segment.label, found.operatoryId, found.providerId, new Date(placedSegment.startMs), new Date(placedSegment.endMs)])
      }
      day.count += 1
      siteVisits += 1
    }
    placed += siteVisits
    const t1 = performance.now()
    await connection.query('BEGIN')
    await insert('visits', ['id', 'site_id', 'operatory_id', 'provider_id', 'patient_id', 'start_utc', 'end_utc', 'state', 'plan', 'ical_uid'], visitRows)
    await insert('visit_segments', ['id', 'visit_id', 'kind', 'label', 'operatory_id', 'provider_id', 'start_utc', 'end_utc'], segmentRows)
    await connection.query('COMMIT')
    engineMs += t1 - t0
    writeMs += performance.now() - t1
    if (step % 10 === 9) log(`group scale: ${step + 1} sites, ${placed} visits (engine ${(engineMs / 1000).toFixed(0)} s, writes ${(writeMs / 1000).toFixed(0)} s)`)
  }
  await connection.query('CREATE TABLE groupscale_fingerprint (id INT PRIMARY KEY, fingerprint VARCHAR(500) NOT NULL)')
  await connection.query('INSERT INTO groupscale_fingerprint VALUES (1, ?)', [fingerprint])
  await connection.query('ANALYZE TABLE visits, visit_segments, patients')
  await connection.end()
  log(`group scale: ${placed} visits, ${segmentId} segments in ${database} (engine ${(engineMs / 1000).toFixed(0)} s, writes ${(writeMs / 1000).toFixed(0)} s)`)
}
