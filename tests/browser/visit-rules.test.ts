// Issue 11 §5 on screen, in real Chromium: a dentist moves their own visit through its states on
// My day today, and the Chairboard's visit panel offers a dentist no Move, Change length or Cancel,
// and no state buttons on another provider's visit. The visits are booked today in a test annex
// whose zone makes it late morning now, so the test passes at any hour (server and browser agree on now).
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { middayZone, startIn } from '../helpers/midday'

let browser: BrowserSession
let annex: Annex
let dentistEmail: string
const visits: Array<{ id: number; patientName: string }> = []

beforeAll(async () => {
  annex = await createAnnex({ rooms: 2, providers: 2, patients: 2, timeZone: middayZone() })
  dentistEmail = (await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('providers.id', annex.providerIds[0]).first('users.email')).email
  const admin = await signedInAs('admin@fernhollow.test')
  for (const index of [0, 1]) {
    const booked = await admin.post('/api/visits', {
      siteId: annex.siteId, operatoryId: annex.operatoryIds[index], providerId: annex.providerIds[index], patientId: annex.patientIds[index], items: FILLING, startUtc: startIn(30),
    })
    expect(booked.status, JSON.stringify(booked.body)).toBe(201)
    const patient = await testDb()('patients').where({ id: annex.patientIds[index] }).first('first_name', 'last_name')
    visits.push({ id: booked.body.id, patientName: `${patient.first_name} ${patient.last_name}` })
  }
  browser = await openBrowser(inject('baseURL'), { width: 1400, height: 1200 })
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('a dentist and the visit rules on screen', () => {
  it('moves their own visit arrived → in treatment on My day, today', async () => {
    const { page } = browser
    await signInThroughForm(page, dentistEmail, 'annex-provider-password')
    await page.waitForURL(/\/my-day$/)
    const own = visits[0]!
    const block = page.locator(`[data-testid="myday-visit"][data-visit-id="${own.id}"]`)
    await expect.poll(() => block.count()).toBe(1)
    await block.getByRole('button', { name: `Mark arrived: ${own.patientName}` }).click()
    await expect.poll(async () => (await testDb()('visits').where({ id: own.id }).first('state')).state).toBe('arrived')
    await block.getByRole('button', { name: `Start treatment: ${own.patientName}` }).click()
    await expect.poll(async () => (await testDb()('visits').where({ id: own.id }).first('state')).state).toBe('treating')
    expect(await block.getByTestId('visit-state').getAttribute('data-state')).toBe('treating')
    // Every view of the visit follows the change, not only the button that made it.
    await expect.poll(() => page.getByTestId('next-up-item').filter({ hasText: own.patientName }).getByTestId('visit-state').getAttribute('data-state')).toBe('treating')
    await screenshot(page, 'my-day-own-visit-treating')
  })

  it('sees no Move, Change length or Cancel in the Chairboard\'s visit panel, and no state buttons on another provider\'s visit', async () => {
    const { page } = browser
    await page.goto(`${inject('baseURL')}/chairboard`)
    const [own, other] = visits as [typeof visits[0], typeof visits[0]]

    await page.getByRole('button', { name: `Open the visit of ${own.patientName}` }).first().click()
    const panel = page.getByTestId('visit-panel')
    await expect.poll(() => panel.textContent()).toContain(own.patientName)
    // Their own visit in treatment: finishing it is offered (once the screen knows who they are).
    await expect.poll(() => panel.getByRole('button', { name: 'Mark finished' }).count()).toBe(1)
    for (const control of ['Move visit', 'Change length', 'Cancel visit']) {
      expect(await panel.getByRole('button', { name: control }).count(), control).toBe(0)
    }
    expect(await panel.getByLabel('Reason for cancelling').count()).toBe(0)
    await screenshot(page, 'visit-panel-dentist-own')

    await page.getByRole('button', { name: `Open the visit of ${other.patientName}` }).first().click()
    await expect.poll(() => panel.textContent()).toContain(other.patientName)
    expect(await panel.getByRole('button', { name: /^Mark / }).count()).toBe(0)
    for (const control of ['Move visit', 'Change length', 'Cancel visit']) {
      expect(await panel.getByRole('button', { name: control }).count(), control).toBe(0)
    }
    await screenshot(page, 'visit-panel-dentist-other')
  })
})
