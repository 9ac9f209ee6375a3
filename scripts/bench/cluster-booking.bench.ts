// Booking through two app processes behind HAProxy on the three-node Galera cluster (issue 19 §3),
// in one run beside one app process on the single MariaDB, each with its raw mysql2 ceiling:
// 16 clients, non-conflicting bookings at the bench annex (scripts/lib/bench-annex.ts), bookings/s,
// p50/p95 and CPU per booking of every process involved. Figures only, no assertions.
//
// Heavy: three database nodes, HAProxy and two app processes on this machine. `npm run bench` therefore
// skips it unless BENCH_CLUSTER=1; it then starts the cluster itself (scripts/cluster/start.sh, ports
// from CLUSTER_PORT_BASE, the demo without its visits) and stops it at the end (BENCH_CLUSTER_KEEP=1
// leaves it running). The cluster's app processes run with the mail dispatcher off, as the single one does.
import { spawnSync } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { createDb, dbSettingsFromEnv } from '../../db/connection'
import { freshBenchDatabase } from '../lib/bench'
import { signIn } from '../lib/bench-http'
import { benchAnnex, cpuLine, httpBookings, rawCeiling, withCpu, type BenchAnnex } from '../lib/bench-annex'
import { startAppServer } from '../lib/app-server'

const CLIENTS = 16
const BOOKINGS_PER_CLIENT = 40
const WARM_UP_PER_CLIENT = 5
const SINGLE_DATABASE = 'cuspline_cluster_bench'
const ADMIN = { email: 'admin@fernhollow.test', password: 'cuspline-demo' }
const fmt = (value: number) => value.toFixed(1)

if (process.env.BENCH_CLUSTER !== '1') {
  console.log('cluster booking: skipped (heavy: three Galera nodes, HAProxy and two app processes). Run it with BENCH_CLUSTER=1 npm run bench,')
  console.log('  or BENCH_CLUSTER=1 bash scripts/with-env.sh tsx scripts/bench/cluster-booking.bench.ts; CLUSTER_PORT_BASE moves its ports.')
  process.exit(0)
}

const root = resolve('.')
const portBase = Number(process.env.CLUSTER_PORT_BASE ?? 4400)
const clusterDir = `${root}/.data/cluster`
/** The cluster scripts get a clean environment: this process's single-database settings must not leak into them. */
const clusterEnv = {
  PATH: process.env.PATH ?? '', HOME: process.env.HOME ?? '/root', LANG: process.env.LANG ?? 'C.UTF-8',
  CLUSTER_PORT_BASE: String(portBase), CLUSTER_SKIP_DEMO_VISITS: '1', NUXT_OUTBOX_DISPATCHER: 'false',
  SMS_FAKE_PORT: process.env.SMS_FAKE_PORT ?? '4010',
}
const runCluster = (script: 'start' | 'stop') => {
  const ran = spawnSync('bash', [`scripts/cluster/${script}.sh`], { cwd: root, env: clusterEnv, stdio: ['ignore', 'inherit', 'inherit'] })
  if (ran.status !== 0) throw new Error(`scripts/cluster/${script}.sh exited with ${ran.status}`)
}
const pidIn = (file: string) => Number(readFileSync(file, 'utf8').trim())

type Run = Awaited<ReturnType<typeof measure>>

/**
 * Until the app answers through its address three times in a row (at most 30 s): just after the
 * cluster starts, HAProxy may still count an app process down from a health check made before it
 * listened, and answer 503 (seen once here, at the first sign-in).
 */
async function untilServing(baseURL: string): Promise<void> {
  const deadline = Date.now() + 30_000
  let inRow = 0
  while (inRow < 3) {
    const status = await fetch(`${baseURL}/api/me`).then((answer) => answer.status, () => 0)
    inRow = status === 401 ? inRow + 1 : 0
    if (Date.now() > deadline) throw new Error(`${baseURL} did not answer GET /api/me with 401 within 30 s (last: ${status})`)
    if (inRow < 3) await new Promise((wait) => setTimeout(wait, 300))
  }
}

/** Warm-up, the ceiling, then HTTP bookings, each timed with the CPU of the given processes. */
async function measure(baseURL: string, annex: BenchAnnex, database: string, connection: Parameters<typeof rawCeiling>[4], pids: { database: Record<string, number>; app: Record<string, number> }) {
  await untilServing(baseURL)
  const cookies: string[] = []
  // One after another: sign-in counts attempts in flight per account and address.
  for (let client = 0; client < CLIENTS; client += 1) cookies.push(await signIn(baseURL, ADMIN.email, ADMIN.password))
  await rawCeiling(annex, database, 0, WARM_UP_PER_CLIENT, connection)
  await httpBookings(baseURL, annex, cookies, 0, WARM_UP_PER_CLIENT)
  const total = CLIENTS * BOOKINGS_PER_CLIENT
  const ceiling = await withCpu({ client: process.pid, ...pids.database }, total, () => rawCeiling(annex, database, WARM_UP_PER_CLIENT, BOOKINGS_PER_CLIENT, connection))
  const http = await withCpu({ client: process.pid, ...pids.app, ...pids.database }, total, () => httpBookings(baseURL, annex, cookies, WARM_UP_PER_CLIENT, BOOKINGS_PER_CLIENT))
  return { ceiling, http }
}

function report(title: string, run: Run) {
  console.log(title)
  console.log(`  raw mysql2 ceiling  : ${fmt(run.ceiling.perSecond)} bookings/s (p50 ${fmt(run.ceiling.p50)} ms, p95 ${fmt(run.ceiling.p95)} ms)`)
  console.log(`  HTTP through the app: ${fmt(run.http.perSecond)} bookings/s (p50 ${fmt(run.http.p50)} ms, p95 ${fmt(run.http.p95)} ms, ${run.http.failures} not 201)`)
  console.log(`  app / ceiling       : ${fmt((run.http.perSecond / run.ceiling.perSecond) * 100)} %`)
  console.log(`  CPU ms per booking, ceiling: ${cpuLine(run.ceiling.cpuMs)}`)
  console.log(`  CPU ms per booking, HTTP   : ${cpuLine(run.http.cpuMs)}`)
}

console.log(`Booking, ${CLIENTS} clients × ${BOOKINGS_PER_CLIENT} non-conflicting bookings (after ${WARM_UP_PER_CLIENT} warm-up each), load average at start ${readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ')}`)

// ------------------------------------------------------------ one app process, the single MariaDB
const single = await freshBenchDatabase(SINGLE_DATABASE, { adminDatabase: dbSettingsFromEnv().database, poolMax: 4 })
const singleAnnex = await benchAnnex(single, CLIENTS)
await single.destroy()
const server = await startAppServer({ NUXT_DB_DATABASE: SINGLE_DATABASE, NUXT_OUTBOX_DISPATCHER: 'false' })
let singleRun: Run
try {
  const database = pidIn(`${process.env.DATA_DIR ?? '.data'}/mariadb.pid`)
  singleRun = await measure(server.url, singleAnnex, SINGLE_DATABASE, {}, { database: { database }, app: { app: server.pid } })
} finally {
  await server.stop()
}

// ------------------------------------------------------------ two app processes, HAProxy, Galera
runCluster('start')
try {
  const writePort = portBase + 40
  const password = readFileSync(`${clusterDir}/db-password`, 'utf8').trim()
  const clusterDb = createDb({ ...dbSettingsFromEnv(), host: '127.0.0.1', port: writePort, password, database: 'cuspline', poolMax: 4 })
  const clusterAnnex = await benchAnnex(clusterDb, CLIENTS)
  await clusterDb.destroy()
  const nodes = Object.fromEntries([1, 2, 3].map((n) => [`node${n}`, pidIn(`${clusterDir}/n${n}/mariadb.pid`)]))
  const apps = { app1: pidIn(`${clusterDir}/app1.pid`), app2: pidIn(`${clusterDir}/app2.pid`), haproxy: pidIn(`${clusterDir}/haproxy.pid`) }
  const clusterRun = await measure(`http://127.0.0.1:${portBase + 42}`, clusterAnnex, 'cuspline', { port: writePort, password }, { database: nodes, app: apps })

  report('One app process, single MariaDB (durable settings)', singleRun)
  report('Two app processes through HAProxy, three-node Galera cluster (writes to one node, as HAProxy sends them; ceiling through the same write listener)', clusterRun)
  console.log(`  cluster / single, HTTP: ${fmt((clusterRun.http.perSecond / singleRun.http.perSecond) * 100)} %; cluster / single, ceiling: ${fmt((clusterRun.ceiling.perSecond / singleRun.ceiling.perSecond) * 100)} %`)
  console.log(`  load average at end ${readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ')}`)
} finally {
  if (process.env.BENCH_CLUSTER_KEEP !== '1') runCluster('stop')
}
