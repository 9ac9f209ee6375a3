// My day keeps itself fresh with the same ETag polling as the Chairboard (composables/usePolledVisits.ts):
// a visit the front desk books for the dentist today appears without a reload, with its tooth in the
// site's notation (ISO 3950 here: Universal 19 is ISO 36). Booked today in a test annex whose zone makes
// it late morning now (tests/helpers/midday.ts), so the test passes at any hour.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { middayZone, startIn } from '../helpers/midday'

let browser: BrowserSession
let annex: Annex
let dentistEmail: string

beforeAll(async () => {
  annex = await createAnnex({ rooms: 1, providers: 1, patients: 1, timeZone: middayZone() })
  await testDb()('sites').where({ id: annex.siteId }).update({ tooth_notation: 'iso' })
  dentistEmail = (await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('providers.id', annex.providerIds[0]).first('users.email')).email
  browser = await openBrowser(inject('baseURL'), { width: 1400, height: 1000 })
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('My day, live', () => {
  it('shows a visit booked by the front desk while the page is open, tooth in the site\'s notation', async () => {
    const { page } = browser
    await signInThroughForm(page, dentistEmail, 'annex-provider-password')
    await page.waitForURL(/\/my-day$/)
    await page.getByTestId('myday-empty').waitFor()

    const admin = await signedInAs('admin@fernhollow.test')
    const booked = await admin.post('/api/visits', {
      siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[0], items: FILLING, startUtc: startIn(60),
    })
    expect(booked.status, JSON.stringify(booked.body)).toBe(201)

    const block = page.locator(`[data-testid="myday-visit"][data-visit-id="${booked.body.id}"]`)
    await expect.poll(() => block.count(), { timeout: 10_000 }).toBe(1)
    expect(await block.textContent()).toContain('Posterior composite 36 MO')
    await screenshot(page, 'my-day-live-booking')
  })
})
