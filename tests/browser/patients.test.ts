// The Patients screen: find a patient and see their coming visits.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { ApiClient } from '../helpers/api-client'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { closeTestDb, siteIdBySlug, testDb } from '../helpers/db'
import { FILLING } from '../helpers/booking-fixtures'
import { atAhead, weekdayAhead, daysFromToday, TUESDAY, THURSDAY } from '../helpers/dates'

let browser: BrowserSession
beforeAll(async () => { browser = await openBrowser(inject('baseURL')) })
afterAll(async () => { await browser?.close(); await closeTestDb() })

describe('Patients screen', () => {
  it('finds a patient by name and lists the visit booked for them', async () => {
    const api = new ApiClient(inject('baseURL'))
    await api.signIn('desk.quarry@fernhollow.test')
    const quarry = await siteIdBySlug('quarry-street')
    const chair = await testDb()('operatories').where({ site_id: quarry, name: 'Chair 1' }).first('id')
    const dentist = await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('users.email', 'dentist@fernhollow.test').first('providers.id')
    const patient = await api.post('/api/patients', { firstName: 'Quillon', lastName: 'Patientscreen', dateOfBirth: '1984-07-09', phone: '(209) 555-0177' })
    expect(patient.status).toBe(201)
    // The screen lists the next six weeks: next week's Tuesday (or its Thursday, should the Tuesday be a
    // closed day), when the demo dentist is at Quarry Street; the Week test books that week's first opening.
    const weekday = [TUESDAY, THURSDAY].find((day) => weekdayAhead(1, day, 'America/Los_Angeles') <= daysFromToday(42, 'America/Los_Angeles'))!
    const booked = await api.post('/api/visits', { patientId: patient.body.id, siteId: quarry, operatoryId: chair.id, providerId: dentist.id, startUtc: atAhead(1, weekday, '10:30', 'America/Los_Angeles'), items: FILLING })
    expect(booked.status).toBe(201)

    const { page } = browser
    await signInThroughForm(page, 'desk.quarry@fernhollow.test')
    await page.waitForURL(/\/chairboard$/)
    await page.goto('/patients')
    await page.getByLabel('Search by name').fill('Patientscreen')
    await page.getByRole('option').filter({ hasText: 'Quillon' }).getByRole('button').click()
    const details = page.getByTestId('patient-details')
    await expect.poll(() => details.textContent()).toContain('Posterior composite 19 MO')
    expect(await details.textContent()).toContain('10:30')
    await screenshot(page, 'patients-screen')
  })
})
