// Importing a 10,000-row patient CSV over HTTP (issue 16 §3; target: under 30 s for upload, preview
// and import together): upload, preview (duplicate matching against the demo's patients and within
// the file), then the import in one transaction. Uses its own database (cuspline_bench_import) and
// the built app. Figures only, no assertions.
import { performance } from 'node:perf_hooks'
import { dbSettingsFromEnv } from '../../db/connection'
import { freshBenchDatabase } from '../lib/bench'

const DATABASE = 'cuspline_bench_import'
const ROWS = 10_000
const HOME_DATABASE = dbSettingsFromEnv().database
process.env.NUXT_DB_DATABASE = DATABASE
const { startAppServer } = await import('../lib/app-server')

/** Invented people: names from syllables, birth dates spread over 80 years, a few 555-01xx phones. */
function sampleCsv(rows: number): string {
  const syllables = ['ka', 'lo', 'mi', 'ren', 'tha', 'vo', 'sel', 'dun', 'pri', 'wen', 'or', 'bel']
  const word = (n: number, parts: number) => Array.from({ length: parts }, (_, index) => syllables[(n >> (index * 3)) % syllables.length]).join('')
  const lines = ['Given name;Family name;Birth date;E-mail;Mobile;Street;City;Postal code']
  for (let index = 0; index < rows; index += 1) {
    const given = word(index * 7 + 3, 2)
    const family = word(index * 13 + 5, 3)
    const born = new Date(Date.UTC(1940, 0, 1) + (index * 2_654_435) % (80 * 365 * 86_400_000 / 1000) * 1000)
    const date = `${String(born.getUTCMonth() + 1).padStart(2, '0')}/${String(born.getUTCDate()).padStart(2, '0')}/${born.getUTCFullYear()}`
    const phone = index < 100 ? `(415) 555-01${String(index).padStart(2, '0')}` : '' // 555-01xx gives only 100 numbers per area code
    lines.push(`${given[0]!.toUpperCase()}${given.slice(1)};${family[0]!.toUpperCase()}${family.slice(1)}${index};${date};p${index}@bench.fernhollow.test;${phone};${index} Bench Road;Fernhollow;9${String(index % 10_000).padStart(4, '0')}`)
  }
  return `${lines.join('\r\n')}\r\n`
}

const db = await freshBenchDatabase(DATABASE, { adminDatabase: HOME_DATABASE })
const siteId = (await db('sites').where({ slug: 'quarry-street' }).first('id')).id as number
await db.destroy()

const server = await startAppServer({ NUXT_DB_DATABASE: DATABASE, NUXT_OUTBOX_DISPATCHER: 'false' })
try {
  const login = await fetch(`${server.url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'admin@fernhollow.test', password: 'cuspline-demo' }) })
  const cookie = login.headers.getSetCookie()[0]!.split(';')[0]!
  const post = async (path: string, body: unknown) => {
    const response = await fetch(`${server.url}${path}`, { method: 'POST', headers: { cookie, 'content-type': 'application/json', origin: server.url }, body: JSON.stringify(body) })
    if (!response.ok) throw new Error(`${path} answered ${response.status}: ${(await response.text()).slice(0, 300)}`)
    return response.json()
  }
  const csv = sampleCsv(ROWS)
  console.log(`patient import, ${ROWS} rows (${(Buffer.byteLength(csv) / 1024 / 1024).toFixed(1)} MB, semicolons, US dates; target < 30 s in all)`)
  const started = performance.now()
  const upload = await post('/api/patient-imports', { siteId, fileName: 'bench.csv', csv })
  const uploaded = performance.now()
  const mapping = upload.mapping
  const preview = await post(`/api/patient-imports/${upload.id}/preview`, { mapping, dateOrder: 'mdy' })
  const previewed = performance.now()
  const report = await post(`/api/patient-imports/${upload.id}/run`, { mapping, dateOrder: 'mdy', choices: {} })
  const done = performance.now()
  console.log(`  upload ${((uploaded - started) / 1000).toFixed(1)} s, preview ${((previewed - uploaded) / 1000).toFixed(1)} s (${preview.counts.valid} valid, ${preview.counts.duplicates} likely duplicates), import ${((done - previewed) / 1000).toFixed(1)} s`)
  console.log(`  total ${((done - started) / 1000).toFixed(1)} s: created ${report.counts.created}, skipped ${report.counts.skipped}, failed ${report.counts.failed}`)
} finally {
  await server.stop()
}
