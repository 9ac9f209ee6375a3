// Issue 13 §3/§4 on screen, in real Chromium: on My day a dentist undoes "arrived", and the numbing
// clock starts only after "anaesthetic given" (before it, the planned onset in words; nothing at all
// before the patient arrives). On the Chairboard the front desk sees a late visit marked in words and
// a glyph, marks it did not come and undoes that in the visit panel; finishing a visit offers booking
// the next one, prefilled, with the anaesthetic technique to choose per procedure. Visits are booked today in a test
// annex whose zone makes it late morning now (tests/helpers/midday.ts), so server and browser agree on now.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { createStaff, middayZone, startIn, STAFF_PASSWORD } from '../helpers/midday'
import { formatTime } from '../../shared/utils/display-time'

let browser: BrowserSession
let annex: Annex
let dentistEmail: string
let deskEmail: string
const visits: Array<{ id: number; patientName: string }> = []
const stateOf = async (id: number) => (await testDb()('visits').where({ id }).first('state')).state as string

beforeAll(async () => {
  annex = await createAnnex({ rooms: 2, providers: 1, patients: 2, timeZone: middayZone() })
  dentistEmail = (await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('providers.id', annex.providerIds[0]).first('users.email')).email
  deskEmail = (await createStaff('front_desk', [annex.siteId])).email
  const admin = await signedInAs('admin@fernhollow.test')
  // Visit 0 starts within the hour (arrivable now); visit 1 is later moved back to have begun 25 minutes ago.
  for (const [index, minutes] of [[0, 30], [1, 120]] as const) {
    const booked = await admin.post('/api/visits', {
      siteId: annex.siteId, operatoryId: annex.operatoryIds[index], providerId: annex.providerIds[0], patientId: annex.patientIds[index], items: FILLING, startUtc: startIn(minutes),
    })
    expect(booked.status, JSON.stringify(booked.body)).toBe(201)
    const patient = await testDb()('patients').where({ id: annex.patientIds[index] }).first('first_name', 'last_name')
    visits.push({ id: booked.body.id, patientName: `${patient.first_name} ${patient.last_name}` })
  }
  const late = visits[1]!.id
  const booked = (await testDb()('visits').where({ id: late }).first('start_utc')).start_utc as Date
  const minutes = Math.round((booked.getTime() - (Date.now() - 25 * 60_000)) / 60_000)
  for (const table of ['visits', 'visit_segments']) {
    await testDb()(table).where(table === 'visits' ? { id: late } : { visit_id: late }).update({
      start_utc: testDb().raw('start_utc - INTERVAL ? MINUTE', [minutes]), end_utc: testDb().raw('end_utc - INTERVAL ? MINUTE', [minutes]),
    })
  }
  browser = await openBrowser(inject('baseURL'), { width: 1400, height: 1200 })
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('undo and the numbing clock', () => {
  it('My day: arrived is undone, and the countdown starts only after "anaesthetic given"', async () => {
    const { page } = browser
    // The browser's clock runs from now; it is moved past the onset below instead of waiting for it.
    await page.clock.install({ time: new Date() })
    await signInThroughForm(page, dentistEmail, 'annex-provider-password')
    await page.waitForURL(/\/my-day$/)
    const own = visits[0]!
    const block = page.locator(`[data-testid="myday-visit"][data-visit-id="${own.id}"]`)
    await expect.poll(() => block.count()).toBe(1)
    // Booked, not arrived: no clock and no onset words.
    expect(await block.getByTestId('numbing-countdown').count()).toBe(0)
    expect(await block.getByTestId('numbing-planned').count()).toBe(0)

    await block.getByRole('button', { name: `Mark arrived: ${own.patientName}` }).click()
    await expect.poll(async () => stateOf(own.id)).toBe('arrived')
    // Arrived: the planned onset in words, still no running clock.
    await expect.poll(() => block.getByTestId('numbing-planned').textContent()).toMatch(/^numbing about \d+ min after the injection$/)
    expect(await block.getByTestId('numbing-countdown').count()).toBe(0)
    expect(await page.getByTestId('numbing-now').textContent()).toContain('Onset times vary by patient, agent and technique; the treating clinician confirms anaesthesia before starting.')

    // Undo arrived: back to booked, said beside the button.
    await block.getByRole('button', { name: 'Undo arrived' }).click()
    await expect.poll(() => block.getByTestId('undo-outcome').textContent()).toBe('Undo arrived: done, the visit is booked again.')
    await expect.poll(async () => stateOf(own.id)).toBe('booked')
    expect(await block.getByTestId('visit-state').getAttribute('data-state')).toBe('booked')
    await screenshot(page, 'undo-arrived-my-day')

    await block.getByRole('button', { name: `Mark arrived: ${own.patientName}` }).click()
    await expect.poll(async () => stateOf(own.id)).toBe('arrived')
    await expect.poll(() => block.getByTestId('anaesthetic-given').count()).toBe(1)
    await block.getByTestId('anaesthetic-given').click()
    await expect.poll(() => block.getByTestId('numbing-countdown').textContent()).toMatch(/Ready in \d+:\d\d/)
    // The time it was recorded, on the annex's own clock (its stored setting) through the shared formatter.
    const given = (await testDb()('visits').where({ id: own.id }).first('anaesthetic_given_at')).anaesthetic_given_at as Date
    expect(given).not.toBeNull()
    const site = await testDb()('sites').where({ id: annex.siteId }).first('time_zone', 'clock', 'date_order')
    expect(await block.getByTestId('anaesthetic-outcome').textContent())
      .toBe(`Anaesthetic given at ${formatTime(given.getTime(), { timeZone: site.time_zone, clock: site.clock, dateOrder: site.date_order })}.`)
    expect(await block.getByTestId('numbing-planned').count()).toBe(0)
    // Arrived again, so "Undo arrived" is offered beside the state buttons.
    expect(await block.getByRole('button', { name: 'Undo arrived' }).count()).toBe(1)
    await screenshot(page, 'numbing-after-anaesthetic-given')
    // Past the onset: "Ready".
    await page.clock.fastForward('20:00')
    await expect.poll(() => block.getByTestId('numbing-countdown').textContent()).toMatch(/^\s*Ready\s*$/)
  })

  it('Chairboard: a late visit is marked in words, marked did not come and that is undone in the panel', async () => {
    const desk = await openBrowser(inject('baseURL'), { width: 1400, height: 1200 })
    const { page } = desk
    try {
      await signInThroughForm(page, deskEmail, STAFF_PASSWORD)
      await page.waitForURL(/\/chairboard/)
      const late = visits[1]!
      const block = page.locator(`[data-testid="visit-block"][data-visit-id="${late.id}"]`)
      await expect.poll(() => block.count()).toBe(1)
      await expect.poll(() => block.getByTestId('late-mark').textContent()).toMatch(/late 2\d min/)
      await screenshot(page, 'chairboard-late-visit')

      await page.getByRole('button', { name: `Open the visit of ${late.patientName}` }).first().click()
      const panel = page.getByTestId('visit-panel')
      await expect.poll(() => panel.textContent()).toContain(late.patientName)
      await panel.getByRole('button', { name: 'Mark did not come' }).click()
      await expect.poll(async () => stateOf(late.id)).toBe('missed')
      await expect.poll(() => panel.getByRole('button', { name: 'Undo did not come' }).count()).toBe(1)
      await panel.getByRole('button', { name: 'Undo did not come' }).click()
      await expect.poll(() => panel.getByTestId('undo-outcome').textContent()).toBe('Undo did not come: done, the visit is booked again.')
      await expect.poll(async () => stateOf(late.id)).toBe('booked')
      expect(await testDb()('visit_segments').where({ visit_id: late.id }).count({ n: '*' }).first().then((row) => Number(row!.n))).toBeGreaterThan(0)
      await screenshot(page, 'chairboard-undo-did-not-come')

      // Finishing a visit offers booking the next one with the patient and its procedures filled in,
      // and the drawer lets the desk choose the anaesthetic technique per procedure.
      const own = visits[0]!
      await page.getByRole('button', { name: `Open the visit of ${own.patientName}` }).first().click()
      await expect.poll(() => panel.textContent()).toContain(own.patientName)
      await panel.getByRole('button', { name: 'Mark in treatment' }).click()
      await expect.poll(async () => stateOf(own.id)).toBe('treating')
      await expect.poll(() => panel.getByRole('button', { name: 'Mark finished' }).isEnabled()).toBe(true)
      await panel.getByRole('button', { name: 'Mark finished' }).click()
      await expect.poll(async () => stateOf(own.id)).toBe('finished')
      await expect.poll(() => panel.getByTestId('book-next').count()).toBe(1)
      await panel.getByTestId('book-next').click()
      const drawer = page.getByTestId('booking-drawer')
      await expect.poll(() => drawer.getByTestId('chosen-patient').textContent().catch(() => '')).toContain(own.patientName)
      expect(await drawer.getByLabel('Procedure', { exact: true }).inputValue()).toBe('COMP-POST')
      expect(await drawer.getByLabel('Tooth (Universal)').inputValue()).toBe('19')
      const technique = drawer.getByTestId('procedure-0-technique')
      expect(await technique.locator('option').first().textContent()).toMatch(/^Template default \((block|infiltration), onset about \d+ min\)$/)
      await technique.selectOption('infiltration')
      expect(await drawer.textContent()).toContain('the treating clinician confirms anaesthesia before starting')
      await screenshot(page, 'booking-drawer-next-visit')
    } finally {
      await desk.close()
    }
  })
})
