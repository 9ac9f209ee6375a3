// Issue 12 on screen, in real Chromium: one rule for moving a visit (shared/domain/visit-states.ts
// canMove, through visit-access.ts): a visit in treatment can be moved from the keyboard in the visit
// panel, as it can be dragged, but no longer cancelled. And the Chairboard keeps one FullCalendar:
// the visit moves on the grid through refetchEvents, and changing days does not remount the calendar.
// The visit is booked today in a test annex whose zone makes it late morning now (tests/helpers/midday.ts).
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { DateTime } from 'luxon'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { createStaff, middayZone, STAFF_PASSWORD, startIn } from '../helpers/midday'

let browser: BrowserSession
let annex: Annex
let desk: { email: string }
let visit: { id: number; patientName: string }

beforeAll(async () => {
  annex = await createAnnex({ rooms: 2, providers: 1, patients: 1, timeZone: middayZone() })
  desk = await createStaff('front_desk', [annex.siteId])
  const admin = await signedInAs('admin@fernhollow.test')
  const booked = await admin.post('/api/visits', {
    siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[0], items: FILLING, startUtc: startIn(30),
  })
  expect(booked.status, JSON.stringify(booked.body)).toBe(201)
  for (const state of ['arrived', 'treating']) {
    const marked = await admin.post(`/api/visits/${booked.body.id}/state`, { state })
    expect(marked.status, JSON.stringify(marked.body)).toBe(200)
  }
  const patient = await testDb()('patients').where({ id: annex.patientIds[0] }).first('first_name', 'last_name')
  visit = { id: booked.body.id, patientName: `${patient.first_name} ${patient.last_name}` }
  browser = await openBrowser(inject('baseURL'), { width: 1400, height: 1200 })
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

const columnDate = (index: number) => DateTime.now().setZone(annex.timeZone).plus({ days: index }).toISODate()!

describe('the Chairboard and a visit in treatment', () => {
  it('offers the desk Move and Change length for a visit in treatment, but not Cancel, and it can be dragged', async () => {
    const { page } = browser
    await signInThroughForm(page, desk.email, STAFF_PASSWORD)
    await page.waitForURL(/\/chairboard$/)
    const open = page.getByRole('button', { name: `Open the visit of ${visit.patientName}` })
    await open.first().waitFor()
    // Draggable on the grid: the same rule decides both.
    await expect.poll(() => page.locator('.fc-event.board-visit.fc-event-draggable').count()).toBe(1)
    await open.first().focus()
    await page.keyboard.press('Enter')
    const panel = page.getByTestId('visit-panel')
    await expect.poll(() => panel.textContent()).toContain(visit.patientName)
    expect(await panel.getByTestId('visit-state').getAttribute('data-state')).toBe('treating')
    await expect.poll(() => panel.getByRole('button', { name: 'Move visit' }).count()).toBe(1)
    expect(await panel.getByRole('button', { name: 'Change length' }).count()).toBe(1)
    expect(await panel.getByRole('button', { name: 'Cancel visit' }).count()).toBe(0)
    expect(await panel.getByLabel('Reason for cancelling').count()).toBe(0)
    await screenshot(page, 'board-rules-treating-panel')
  })

  it('moves it to the other chair from the keyboard, and the grid follows without a reload', async () => {
    const { page } = browser
    // A mark on the calendar's element: a remount would drop it.
    await page.locator('.board-calendar .fc').evaluate((element) => element.setAttribute('data-test-mark', 'kept'))
    const panel = page.getByTestId('visit-panel')
    await panel.getByLabel('Chair').selectOption({ label: 'Room 2' })
    await panel.getByRole('button', { name: 'Move visit' }).press('Enter')
    await expect.poll(() => page.getByTestId('board-notice').textContent()).toMatch(/moved to .* in Room 2/)
    expect((await testDb()('visits').where({ id: visit.id }).first('operatory_id')).operatory_id).toBe(annex.operatoryIds[1])
    const second = page.locator(`td.fc-timegrid-col[data-date="${columnDate(1)}"]`)
    await expect.poll(async () => {
      const block = await page.locator('.fc-event.board-visit').first().boundingBox()
      const column = await second.boundingBox()
      return block !== null && column !== null && block.x >= column.x - 1 && block.x < column.x + column.width
    }).toBe(true)
    expect(await page.locator('.board-calendar .fc[data-test-mark="kept"]').count()).toBe(1)
    await screenshot(page, 'board-rules-moved-to-room-2')
  })

  it('changes days on the same calendar, and the visit comes back with today', async () => {
    const { page } = browser
    await page.getByRole('button', { name: 'Next day' }).click()
    await expect.poll(() => page.locator('.fc-event.board-visit').count()).toBe(0)
    await page.getByRole('button', { name: 'Today' }).click()
    await expect.poll(() => page.locator('.fc-event.board-visit').count()).toBe(1)
    expect(await page.locator('.board-calendar .fc[data-test-mark="kept"]').count()).toBe(1)
  })
})
