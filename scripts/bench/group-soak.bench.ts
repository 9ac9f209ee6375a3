// Memory under a soak at group scale (issue 19 §3): one app process on the group-scale database
// (scripts/lib/group-scale.ts) takes mixed traffic for GROUP_SOAK_MINUTES (default 10): Chairboard
// polling with ETags, openings searches, bookings and moves. Its resident memory is sampled every
// GROUP_SOAK_SAMPLE_SECONDS (default 30) and printed, with the growth over the second half.
// Figures only, no assertions.
import { readFileSync } from 'node:fs'
import { DateTime } from 'luxon'
import { dbSettingsFromEnv } from '../../db/connection'
import { localDayRange } from '../../shared/utils/local-date'
import { call, residentMiB, signIn } from '../lib/bench-http'
import { benchAnnex } from '../lib/bench-annex'
import { GROUP_ADMIN, groupScaleDatabase } from '../lib/group-scale'
import { startAppServer } from '../lib/app-server'

const MINUTES = Number(process.env.GROUP_SOAK_MINUTES ?? 10)
const SAMPLE_SECONDS = Number(process.env.GROUP_SOAK_SAMPLE_SECONDS ?? 30)
const CLIENTS = 4
const THINK_MS = 100 // each client waits this long between requests: steady traffic, not a flood
const ANNEX_ZONE = 'America/Chicago'

const group = await groupScaleDatabase({ adminDatabase: dbSettingsFromEnv().database })
const annex = await benchAnnex(group.db, CLIENTS)
await group.db.destroy()
const server = await startAppServer({ NUXT_DB_DATABASE: group.database, NUXT_OUTBOX_DISPATCHER: 'false' })
const counts = { board: 0, notModified: 0, openings: 0, booked: 0, moved: 0, other: 0 }
try {
  const cookies: string[] = []
  for (let client = 0; client < CLIENTS; client += 1) cookies.push(await signIn(server.url, GROUP_ADMIN.email, GROUP_ADMIN.password))
  const endAt = Date.now() + MINUTES * 60_000
  const etags = new Map<number, string>()
  let random = 20261202
  const next = () => ((random = (random * 1_103_515_245 + 12_345) % 2_147_483_648) / 2_147_483_648)
  const pickSite = () => group.sites[Math.floor(next() * group.sites.length)]!

  async function board(cookie: string) {
    const site = pickSite()
    const range = localDayRange(DateTime.now().setZone(site.zone).toISODate()!, site.zone)
    const etag = etags.get(site.id)
    const answer = await call(`${server.url}/api/visits?siteId=${site.id}&fromUtc=${encodeURIComponent(range.fromUtc)}&toUtc=${encodeURIComponent(range.toUtc)}`, { cookie, headers: etag ? { 'if-none-match': etag } : {} })
    if (answer.status === 304) counts.notModified += 1
    else if (answer.status === 200) { counts.board += 1; etags.set(site.id, String(answer.headers.etag)) } else counts.other += 1
  }

  async function openings(cookie: string) {
    const regionNo = pickSite().region
    const sites = group.sites.filter((site) => site.region === regionNo).slice(0, 5)
    const from = DateTime.now().setZone(sites[0]!.zone).plus({ days: 1 }).toISODate()!
    const answer = await call(`${server.url}/api/openings`, { cookie, body: { items: [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO' }], siteIds: sites.map((site) => site.id), from, to: DateTime.fromISO(from).plus({ days: 6 }).toISODate(), limit: 10 } })
    if (answer.status === 200) counts.openings += 1
    else counts.other += 1
  }

  // Each client books its own annex lane, three hours apart, then moves the visit an hour later.
  const slotIndex = Array.from({ length: CLIENTS }, () => 0)
  async function bookAndMove(cookie: string, lane: number) {
    const index = slotIndex[lane]!++
    const start = DateTime.fromISO(`${annex.firstDay}T00:00`, { zone: ANNEX_ZONE }).plus({ hours: index * 3 })
    const booked = await call(`${server.url}/api/visits`, { cookie, body: { siteId: annex.siteId, ...annex.lanes[lane]!, startUtc: start.toUTC().toISO(), items: [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO' }] } })
    if (booked.status !== 201) { counts.other += 1; return }
    counts.booked += 1
    const visit = JSON.parse(booked.body) as { id: number; rowVersion: number }
    const moved = await call(`${server.url}/api/visits/${visit.id}`, { method: 'PATCH', cookie, body: { rowVersion: visit.rowVersion, startUtc: start.plus({ hours: 1 }).toUTC().toISO() } })
    if (moved.status === 200) counts.moved += 1
    else counts.other += 1
  }

  const samples: Array<{ minute: number; mib: number }> = []
  const began = Date.now()
  const sample = () => {
    const mib = residentMiB(server.pid)
    samples.push({ minute: (Date.now() - began) / 60_000, mib })
    console.log(`  ${((Date.now() - began) / 1000).toFixed(0).padStart(5)} s  RSS ${mib.toFixed(1)} MiB  (board ${counts.board} + ${counts.notModified} not modified, openings ${counts.openings}, booked ${counts.booked}, moved ${counts.moved}, other ${counts.other})`)
  }
  console.log(`Soak at group scale: ${MINUTES} min of mixed traffic, ${CLIENTS} clients with ${THINK_MS} ms between requests; the app's resident memory every ${SAMPLE_SECONDS} s`)
  console.log('  machine shared: load average at start', readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' '))
  sample()
  const sampler = setInterval(sample, SAMPLE_SECONDS * 1000)
  await Promise.all(cookies.map(async (cookie, lane) => {
    while (Date.now() < endAt) {
      const roll = next()
      if (roll < 0.55) await board(cookie)
      else if (roll < 0.8) await openings(cookie)
      else await bookAndMove(cookie, lane)
      await new Promise((wait) => setTimeout(wait, THINK_MS))
    }
  }))
  clearInterval(sampler)
  sample()
  // Resident memory swings with each garbage collection, so growth is read from means, not two samples:
  // the second half's first and last halves compared.
  const half = samples.filter((entry) => entry.minute >= MINUTES / 2).map((entry) => entry.mib)
  const mean = (values: number[]) => values.reduce((sum, value) => sum + value, 0) / Math.max(1, values.length)
  const early = mean(half.slice(0, Math.floor(half.length / 2)))
  const late = mean(half.slice(Math.floor(half.length / 2)))
  const peak = Math.max(...samples.map((entry) => entry.mib))
  console.log(`  peak ${peak.toFixed(1)} MiB (target ≤ 250 MB); second half ${Math.min(...half).toFixed(1)}–${Math.max(...half).toFixed(1)} MiB, mean of its first half ${early.toFixed(1)}, of its last half ${late.toFixed(1)} (${late >= early ? '+' : ''}${(late - early).toFixed(1)} MiB)`)
  console.log('  machine shared: load average at end', readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' '))
} finally {
  await server.stop()
}
