// CSV import and export (issue 16 §3): BOM, semicolons, quoted line breaks, bad dates and phones,
// duplicates in the file and in the database, all or nothing, re-import, size limit, formula escaping.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { randomUUID } from 'node:crypto'
import { signedInAs, type ApiClient } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { atAhead, THURSDAY, weekdayAhead } from '../helpers/dates'

let admin: ApiClient
let annex: Annex
const tag = randomUUID().slice(0, 6)
const MAPPING = { firstName: 'Given', lastName: 'Family', dateOfBirth: 'Born', email: 'Email', phone: 'Phone', addressStreet: 'Street', alertText: 'Alert' }

beforeAll(async () => {
  admin = await signedInAs('admin@fernhollow.test')
  annex = await createAnnex({ rooms: 1, patients: 0 })
})
afterAll(async () => { await closeTestDb() })

async function upload(csv: string, fileName = `patients-${randomUUID().slice(0, 6)}.csv`) {
  const answer = await admin.post('/api/patient-imports', { siteId: annex.siteId, fileName, csv })
  expect(answer.status, JSON.stringify(answer.body)).toBe(201)
  return answer.body as { id: number; headers: string[]; rowCount: number; mapping: Record<string, string>; alreadyImported: unknown }
}
const preview = (id: number, dateOrder = 'month-day-year') => admin.post(`/api/patient-imports/${id}/preview`, { mapping: MAPPING, dateOrder })
const run = (id: number, choices: Record<string, string> = {}, dateOrder = 'month-day-year') => admin.post(`/api/patient-imports/${id}/run`, { mapping: MAPPING, dateOrder, choices })
const familyCount = async (family: string) => Number((await testDb()('patients').where({ last_name: family }).count({ n: '*' }))[0]!.n)

describe('patient import', () => {
  it('reads a BOM, semicolons and a quoted line break; reports bad dates and phones in words; imports the valid rows', async () => {
    const family = `Bomtest${tag}`
    const csv = `\uFEFFGiven;Family;Born;Email;Phone;Street;Alert\r\n`
      + `Ada;${family};07/09/1984;ada.${tag}@fernhollow.test;(415) 555-0171;"1 Way\r\nFlat 2";\r\n`
      + `Bea;${family};02/31/1990;;;;\r\n`
      + `Cal;${family};1979-03-04;;555-01;;\r\n`
      + `Dee;${family};1979-03-05;;+1 415 555 0172;;needs premedication\r\n`
    const uploaded = await upload(csv)
    expect(uploaded.headers).toEqual(['Given', 'Family', 'Born', 'Email', 'Phone', 'Street', 'Alert'])
    expect(uploaded.rowCount).toBe(4)
    const seen = await preview(uploaded.id)
    expect(seen.status, JSON.stringify(seen.body)).toBe(200)
    const byLine = Object.fromEntries(seen.body.rows.map((row: { line: number }) => [row.line, row]))
    expect(Object.keys(byLine)).toEqual(['2', '4', '5', '6'])
    expect(byLine[4].errors.join()).toContain('"02/31/1990" is not a date')
    expect(byLine[5].errors.join()).toContain('"555-01" is not a phone number')
    const report = await run(uploaded.id)
    expect(report.status, JSON.stringify(report.body)).toBe(200)
    expect(report.body.counts).toEqual({ created: 2, merged: 0, skipped: 0, failed: 2 })
    const ada = await testDb()('patients').where({ last_name: family, first_name: 'Ada' }).first()
    expect(ada).toMatchObject({ address_street: '1 Way, Flat 2', phone: '+14155550171', date_of_birth: '1984-07-09', preferred_site_id: annex.siteId })
    expect((await testDb()('patients').where({ last_name: family, first_name: 'Dee' }).first()).alert_text).toBe('needs premedication')

    const csvReport = await admin.get(`/api/patient-imports/${uploaded.id}/report`)
    expect(csvReport.headers.get('content-type')).toContain('text/csv')
    expect(csvReport.body).toContain('4,failed,,')
    const audit = await admin.get(`/api/audit?siteId=${annex.siteId}`)
    expect(audit.body.entries.some((entry: { action: string; entityId: string }) => entry.action === 'patients_imported' && entry.entityId === String(uploaded.id))).toBe(true)
  })

  it('finds duplicates in the file and in the database, and follows the choice per row (skip, merge, create)', async () => {
    const family = `Duptest${tag}`
    const known = await admin.post('/api/patients', { firstName: 'Eli', lastName: family, dateOfBirth: '1970-01-02' })
    const csv = `Given,Family,Born,Email,Phone,Street,Alert\n`
      + `ELI,${family},1970-01-02,,,9 Elm St,\n` // like the database record: merge fills the street
      + `Fay,${family},1971-01-02,fay.${tag}@fernhollow.test,,,\n`
      + `Faye,${family},1972-05-05,FAY.${tag}@fernhollow.test,,,\n` // like line 3 (same e-mail): skipped by default
      + `Eli,${family}s,1970-01-02,,,,\n` // one letter off the database record: created on request
    const uploaded = await upload(csv)
    const seen = await preview(uploaded.id)
    const rows = seen.body.rows as { line: number; duplicates: { patient: { id: number } }[]; sameAsLine: number | null; choice: string }[]
    expect(rows[0]!.duplicates.map((candidate) => candidate.patient.id)).toEqual([known.body.id])
    expect(rows[2]!.sameAsLine).toBe(3)
    expect(rows.map((row) => row.choice)).toEqual(['skip', 'create', 'skip', 'skip'])
    const report = await run(uploaded.id, { 2: 'merge', 5: 'create' })
    expect(report.body.counts).toEqual({ created: 2, merged: 1, skipped: 1, failed: 0 })
    expect((await testDb()('patients').where({ id: known.body.id }).first()).address_street).toBe('9 Elm St')

    // The same file again: nothing new, and the preview says it was imported already.
    const again = await upload(csv)
    expect(again.alreadyImported).toMatchObject({ importId: uploaded.id })
    const before = await familyCount(family) + await familyCount(`${family}s`)
    const second = await run(again.id, { 2: 'create', 3: 'create', 4: 'create', 5: 'create' })
    expect(second.body.counts).toEqual({ created: 0, merged: 0, skipped: 4, failed: 0 })
    expect(await familyCount(family) + await familyCount(`${family}s`)).toBe(before)
  })

  it('imports nothing when the database refuses a row midway (all or nothing)', async () => {
    const family = `Rollback${tag}`
    const db = testDb()
    await db.raw(`CREATE TRIGGER refuse_import_${tag} BEFORE INSERT ON patients FOR EACH ROW
      BEGIN IF NEW.first_name = 'Refuse${tag}' THEN SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'test trigger refuses this row'; END IF; END`)
    try {
      const rows = Array.from({ length: 700 }, (_, index) => `${index === 650 ? `Refuse${tag}` : `P${index}`},${family},1980-01-01,,,,`)
      const uploaded = await upload(`Given,Family,Born,Email,Phone,Street,Alert\n${rows.join('\n')}\n`)
      const report = await run(uploaded.id, Object.fromEntries(rows.map((_, index) => [String(index + 2), 'create'])))
      expect(report.status).toBe(409)
      expect(report.body.message).toContain('Nothing was imported')
      expect(await familyCount(family)).toBe(0)
      expect((await db('patient_imports').where({ id: uploaded.id }).first()).state).toBe('uploaded')
    } finally {
      await db.raw(`DROP TRIGGER refuse_import_${tag}`)
    }
  })

  it('refuses a file over 10 MB with 413, a missing column choice with 400, and the front desk with 403', async () => {
    const big = `Given,Family,Born\n${'x'.repeat(10 * 1024 * 1024)}\n`
    const tooBig = await admin.post('/api/patient-imports', { siteId: annex.siteId, fileName: 'big.csv', csv: big })
    expect(tooBig.status).toBe(413)
    const uploaded = await upload(`Given,Family,Born\nAna,Lee,1980-01-01\n`)
    const noBirth = await admin.post(`/api/patient-imports/${uploaded.id}/preview`, { mapping: { firstName: 'Given', lastName: 'Family' }, dateOrder: 'month-day-year' })
    expect(noBirth.status).toBe(400)
    expect(noBirth.body.data.field).toBe('mapping.dateOfBirth')
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    expect((await desk.post('/api/patient-imports', { siteId: annex.siteId, fileName: 'a.csv', csv: 'a' })).status).toBe(403)
  })
})

describe('exports', () => {
  it('escapes formula-looking cells (OWASP CSV injection) in the patients export', async () => {
    const family = `Export${tag}`
    await admin.post('/api/patients', { firstName: '=HYPERLINK("http://x.test")', lastName: family, dateOfBirth: '1980-01-01', alertText: '@SUM(1)' })
    const csv = await admin.get(`/api/exports/patients?q=${family}`)
    expect(csv.status).toBe(200)
    expect(csv.headers.get('content-type')).toContain('text/csv')
    const lines = (csv.body as string).trim().split('\r\n')
    expect(lines[0]).toContain('Given name,Family name')
    // OWASP "CSV Injection": a cell starting with =, +, -, @, tab or CR is prefixed with a single quote.
    expect(lines[1]).toContain(`"'=HYPERLINK(""http://x.test"")"`)
    expect(lines[1]).toContain(`'@SUM(1)`)
    expect(lines[1]).not.toMatch(/(^|,)[=+\-@]/)
  })

  it('writes the patients\' dates in the chosen site\'s date order, not ISO (issue 14 site setting; shared/utils/display-time.ts, no outside source)', async () => {
    const family = `Datesout${tag}`
    await admin.post('/api/patients', { firstName: 'Dora', lastName: family, dateOfBirth: '1984-07-09', email: `dora.${tag}@fernhollow.test`, emailConsent: true })
    await testDb()('sites').where({ id: annex.siteId }).update({ clock: '24h', date_order: 'day-month-year' })
    const dayFirst = await admin.get(`/api/exports/patients?q=${family}&siteId=${annex.siteId}`)
    expect(dayFirst.status).toBe(200)
    const [header, row] = (dayFirst.body as string).trim().split('\r\n') as [string, string]
    const cells = row.split(',')
    const column = (name: string) => cells[header.split(',').indexOf(name)]
    expect(column('Birth date')).toBe('09/07/1984')
    // Consent given today: its date in the same order.
    expect(column('E-mail consent since')).toMatch(/^\d{2}\/\d{2}\/\d{4}$/)
    expect(row).not.toContain('1984-07-09')
    // Without a site: the default order, month/day/year.
    const plain = await admin.get(`/api/exports/patients?q=${family}`)
    expect((plain.body as string)).toContain(',07/09/1984,')
    // A site id that is not a number is a 400.
    expect((await admin.get(`/api/exports/patients?q=${family}&siteId=abc`)).status).toBe(400)
  })

  it('exports a site\'s visits over local dates in the site\'s date order and clock (issue 14 site setting; shared/utils/display-time.ts, no outside source)', async () => {
    const patient = await admin.post('/api/patients', { firstName: 'Vee', lastName: `Visitexport${tag}`, dateOfBirth: '1980-01-01' })
    const booked = await admin.post('/api/visits', { patientId: patient.body.id, siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], startUtc: atAhead(6, THURSDAY, '09:30', annex.timeZone), items: FILLING })
    expect(booked.status).toBe(201)
    const day = weekdayAhead(6, THURSDAY, annex.timeZone)
    const csv = await admin.get(`/api/exports/visits?siteId=${annex.siteId}&from=${day}&to=${day}`)
    expect(csv.status).toBe(200)
    const [year, month, date] = day.split('-')
    await testDb()('sites').where({ id: annex.siteId }).update({ clock: '24h', date_order: 'day-month-year' })
    const dayFirst = await admin.get(`/api/exports/visits?siteId=${annex.siteId}&from=${day}&to=${day}`)
    expect(dayFirst.body).toContain(`${booked.body.id},${date}/${month}/${year},09:30,`)
    expect(dayFirst.body).not.toContain(day)
    await testDb()('sites').where({ id: annex.siteId }).update({ clock: '12h', date_order: 'month-day-year' })
    const monthFirst = await admin.get(`/api/exports/visits?siteId=${annex.siteId}&from=${day}&to=${day}`)
    expect(monthFirst.body).toContain(`${booked.body.id},${month}/${date}/${year},9:30 AM,`)
    expect((await admin.get(`/api/exports/visits?siteId=${annex.siteId}&from=${day}&to=2099-01-01`)).status).toBe(400)
  })
})
