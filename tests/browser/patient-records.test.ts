// Patient records on screen (issue 16): edit a record, the duplicate warning when registering, a CSV
// import with its preview and report, and the Audit screen showing the import and an edit.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { randomUUID } from 'node:crypto'
import { signedInAs, type ApiClient } from '../helpers/api-client'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { closeTestDb, testDb } from '../helpers/db'

let browser: BrowserSession
let manager: ApiClient
const tag = randomUUID().slice(0, 6).replace(/\d/g, 'x')

beforeAll(async () => {
  browser = await openBrowser(inject('baseURL'))
  manager = await signedInAs('manager@fernhollow.test')
  await signInThroughForm(browser.page, 'manager@fernhollow.test')
  await browser.page.waitForURL(/\/chairboard$/)
})
afterAll(async () => { await browser?.close(); await closeTestDb() })

describe('patient records on screen', () => {
  it('edits a patient record and shows the alert with its caution', async () => {
    const created = await manager.post('/api/patients', { firstName: 'Rosalind', lastName: `Editscreen${tag}`, dateOfBirth: '1979-03-14', phone: '+12095550166' })
    const { page } = browser
    await page.goto(`/patients/${created.body.id}`)
    await expect.poll(() => page.getByTestId('patient-details').textContent()).toContain('(209) 555-0166')
    await page.getByRole('button', { name: 'Edit record' }).click()
    await page.getByLabel('Preferred name').fill('Ros')
    await page.getByLabel('Street and number').fill('5 Quillon Row')
    await page.getByLabel('Alert (a few words)').fill('check premedication with the dentist')
    await page.getByTestId('consent-sms').check()
    await page.getByLabel('How they agreed').nth(1).selectOption('form')
    await screenshot(page, 'patient-record-editing')
    await page.getByRole('button', { name: 'Save record' }).click()
    await expect.poll(() => page.getByTestId('record-alert').textContent()).toContain('check premedication')
    expect(await page.getByTestId('record-alert').textContent()).toContain('the clinical record, not Cuspline, is the source of truth')
    expect(await page.getByTestId('patient-name').textContent()).toContain('Ros')
    expect(await page.getByTestId('patient-details').textContent()).toContain('5 Quillon Row')
    await screenshot(page, 'patient-record-saved')
    const stored = await testDb()('patients').where({ id: created.body.id }).first()
    expect(stored).toMatchObject({ preferred_name: 'Ros', sms_consent: 1, sms_consent_source: 'form', row_version: 2 })
  })

  it('warns before registering a likely duplicate and lets the desk choose the existing patient', async () => {
    const existing = await manager.post('/api/patients', { firstName: 'Benedikt', lastName: `Dupscreen${tag}`, dateOfBirth: '1966-06-06' })
    const { page } = browser
    await page.goto('/patients')
    await page.getByRole('button', { name: 'New patient' }).click()
    await page.getByLabel('First name').fill('Bénédikt')
    await page.getByLabel('Last name').fill(`dupscreen${tag}`)
    await page.getByLabel('Birth date').fill('1966-06-06')
    await page.getByRole('button', { name: 'Register patient' }).click()
    const warning = page.getByTestId('duplicate-warning')
    await expect.poll(() => warning.textContent()).toContain('same birth date and a similar name')
    await screenshot(page, 'patient-duplicate-warning')
    await warning.getByRole('button', { name: 'It is this patient' }).click()
    await expect.poll(() => page.getByTestId('chosen-patient').textContent()).toContain('Benedikt')
    expect(await testDb()('patients').where({ last_name: `Dupscreen${tag}` }).count({ n: '*' })).toEqual([{ n: 1 }])
    expect(existing.status).toBe(201)
  })

  it('imports a CSV file through the screen with its preview and report', async () => {
    const { page } = browser
    const csv = `\uFEFFGiven name;Family name;Birth date;E-mail;Mobile\n`
      + `Wren;Importscreen${tag};03/04/1985;wren.${tag}@fernhollow.test;(415) 555-0167\n`
      + `Ossian;Importscreen${tag};31/31/1985;;\n`
      + `Wrenn;Importscreen${tag};03/04/1985;;\n`
    await page.goto('/patients')
    await page.getByTestId('import-link').click()
    await page.waitForURL(/\/patients\/import$/)
    await page.getByLabel('CSV file').setInputFiles({ name: `screen-${tag}.csv`, mimeType: 'text/csv', buffer: Buffer.from(csv, 'utf8') })
    await expect.poll(() => page.getByTestId('import-mapping').textContent()).toContain('3 rows')
    expect(await page.getByLabel('Birth date', { exact: true }).inputValue()).toBe('Birth date')
    await page.getByRole('button', { name: 'Preview' }).click()
    const preview = page.getByTestId('import-preview')
    await expect.poll(() => preview.textContent()).toContain('"31/31/1985" is not a date')
    expect(await preview.textContent()).toContain('Like line 2 of this file')
    await screenshot(page, 'patient-import-preview')
    await page.getByTestId('run-import').click()
    const report = page.getByTestId('import-report')
    await expect.poll(() => report.textContent()).toContain('Created 1, merged 0, skipped 1, failed 1')
    await screenshot(page, 'patient-import-report')
    const download = await page.getByTestId('report-download').getAttribute('href')
    expect((await manager.get(download!)).body).toContain('Line,Outcome,Patient id,Why,File')
  })

  it('shows the import and an edit on the Audit screen', async () => {
    const created = await manager.post('/api/patients', { firstName: 'Audra', lastName: `Auditscreen${tag}`, dateOfBirth: '1990-02-02' })
    const record = (await manager.get(`/api/patients/${created.body.id}`)).body
    expect((await manager.patch(`/api/patients/${created.body.id}`, { ...record, preferredName: 'Audie' })).status).toBe(200)
    const managerId = (await testDb()('users').where({ email: 'manager@fernhollow.test' }).first('id')).id
    const { page } = browser
    await page.goto('/audit')
    await page.getByLabel('Person').selectOption(String(managerId))
    await page.getByRole('button', { name: 'Show' }).click()
    const entries = page.getByTestId('audit-entries')
    await expect.poll(() => entries.textContent()).toContain('patients imported')
    expect(await entries.textContent()).toContain('preferredName: — → Audie')
    await screenshot(page, 'audit-screen')
  })
})
