// How long the Chairboard takes to draw a site day with 60 visits once the data has arrived, in
// Debian's Chromium against the built app (own database cuspline_bench_board). Figures only.
import { performance } from 'node:perf_hooks'
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { gzipSync } from 'node:zlib'
import { DateTime } from 'luxon'
import type { Knex } from 'knex'
import { dbSettingsFromEnv } from '../../db/connection'
import { freshBenchDatabase, mondayAhead } from '../lib/bench'

const DATABASE = 'cuspline_bench_board'
const ZONE = 'America/Los_Angeles'
const DAY = mondayAhead(4, ZONE) // a Monday, when the demo dentist is at Quarry Street
const RUNS = 7
const HOME_DATABASE = dbSettingsFromEnv().database // an existing database to connect to while creating ours
process.env.NUXT_DB_DATABASE = DATABASE
const { startAppServer } = await import('../lib/app-server')
const { openBrowser, signInThroughForm } = await import('../../tests/helpers/browser')

/** 60 visits in Quarry Street's five rooms: 12 per room, 40 minutes apart, straight into the tables. */
async function sixtyVisits(db: Knex): Promise<void> {
  const site = await db('sites').where({ slug: 'quarry-street' }).first('id')
  const rooms: number[] = await db('operatories').where({ site_id: site.id }).orderBy('sort_order').pluck('id')
  const providers: number[] = await db('providers').orderBy('id').limit(5).pluck('id')
  const patients: number[] = await db('patients').orderBy('id').limit(60).pluck('id')
  let n = 0
  for (const [index, room] of rooms.entries()) {
    for (let slot = 0; slot < 12; slot += 1) {
      const start = DateTime.fromISO(`${DAY}T07:00`, { zone: ZONE }).plus({ minutes: slot * 40 })
      const [id] = await db('visits').insert({
        site_id: site.id, operatory_id: room, provider_id: providers[index], patient_id: patients[n],
        start_utc: start.toJSDate(), end_utc: start.plus({ minutes: 35 }).toJSDate(), ical_uid: `bench-${n}@cuspline`,
        plan: JSON.stringify({ items: [{ templateCode: 'COMP-POST', templateName: 'Posterior composite', tooth: { universal: '19', iso: '36' }, surfaces: ['M', 'O'] }] }),
      })
      const bands = [['assist', 0, 5], ['hands_on', 5, 7], ['numbing', 7, 17], ['hands_on', 17, 30], ['reset', 30, 35]] as const
      await db('visit_segments').insert(bands.map(([kind, from, to]) => ({
        visit_id: id, kind, label: kind, operatory_id: room, provider_id: providers[index],
        start_utc: start.plus({ minutes: from }).toJSDate(), end_utc: start.plus({ minutes: to }).toJSDate(),
      })))
      n += 1
    }
  }
}

const db = await freshBenchDatabase(DATABASE, { adminDatabase: HOME_DATABASE })
await sixtyVisits(db)
const server = await startAppServer({ NUXT_DB_DATABASE: DATABASE })
const browser = await openBrowser(server.url, { width: 1400, height: 1600 })
try {
  await signInThroughForm(browser.page, 'desk.quarry@fernhollow.test')
  await browser.page.waitForURL(/chairboard/)
  // JavaScript the Chairboard route loads, gzipped as a server would send it.
  const scripts = new Set<string>()
  browser.page.on('request', (request) => { if (request.resourceType() === 'script') scripts.add(new URL(request.url()).pathname) })
  await browser.page.goto('/chairboard')
  await browser.page.locator('td.fc-timegrid-col').first().waitFor()
  const gzipped = [...scripts].reduce((total, path) => total + gzipSync(readFileSync(join('.output/public', path))).length, 0)
  console.log(`Chairboard route JavaScript: ${scripts.size} files, ${(gzipped / 1024).toFixed(0)} KiB gzipped`)
  const timings: number[] = []
  for (let run = 0; run < RUNS; run += 1) {
    await browser.page.goto('/chairboard')
    await browser.page.locator('td.fc-timegrid-col').first().waitFor()
    const response = browser.page.waitForResponse((answer) => answer.url().includes('/api/visits?') && answer.status() === 200)
    await browser.page.locator('#board-date').fill(DAY)
    await (await response).finished()
    const arrived = performance.now()
    await browser.page.waitForFunction(() => document.querySelectorAll('[data-testid="visit-block"]').length >= 60)
    timings.push(performance.now() - arrived)
  }
  timings.sort((a, b) => a - b)
  console.log(`Chairboard, one site day with 60 visits: drawn ${timings[Math.floor(RUNS / 2)]!.toFixed(0)} ms median after the data arrived (min ${timings[0]!.toFixed(0)}, max ${timings.at(-1)!.toFixed(0)} ms, ${RUNS} runs)`)
} finally {
  await browser.close()
  await server.stop()
  await db.destroy()
}
