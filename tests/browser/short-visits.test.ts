// Issue 14 on short and overlapping visits, in real Chromium at 1440×900 and 1024×768:
// - My day: visits of 15 and 20 minutes (shorter than 30) back to back in one chair keep their
//   "Mark arrived" whole, on top and pressable, at least 24×24 CSS px (WCAG 2.2 §2.5.8 Target Size
//   (Minimum)), and a press marks the visit arrived.
// - Chairboard: a 30-minute visit's card shows name, tooth with surfaces and state inside the card.
// - Provider week: visits that overlap in time sit side by side with their names whole.
// axe-core (WCAG 2.2 A/AA tags) finds nothing unlisted on the three screens. A test annex of its own,
// in a zone where it is late morning now (tests/helpers/midday.ts), so the visits are "today".
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession, type Page } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, type Annex } from '../helpers/booking-fixtures'
import { createStaff, middayZone, STAFF_PASSWORD, startIn } from '../helpers/midday'
import { runAxe, unlisted, type AllowedViolation } from '../helpers/axe'

const ALLOWED = JSON.parse(readFileSync(join(process.cwd(), 'tests', 'browser', 'axe-allow-list.json'), 'utf8')) as AllowedViolation[]
// Invented names of an ordinary length for a front desk's screen.
const NAMES = [['Wren', 'Ashby'], ['Otto', 'Pellworth'], ['Lena', 'Marchetti'], ['Ivo', 'Castellan']] as const

let annex: Annex
let deskEmail: string
let dentistEmail: string
const visits: Record<string, { id: number; name: string }> = {}

const plus = (iso: string, minutes: number) => new Date(Date.parse(iso) + minutes * 60_000).toISOString().replace('.000Z', 'Z')

async function book(key: string, patientIndex: number, room: number, startUtc: string, items: unknown[], chairMinutes?: number) {
  const admin = await signedInAs('admin@fernhollow.test')
  const booked = await admin.post('/api/visits', { siteId: annex.siteId, providerId: annex.providerIds[0], operatoryId: annex.operatoryIds[room], patientId: annex.patientIds[patientIndex], startUtc, items })
  expect(booked.status, JSON.stringify(booked.body)).toBe(201)
  if (chairMinutes !== undefined) {
    const shortened = await admin.patch(`/api/visits/${booked.body.id}`, { rowVersion: booked.body.rowVersion, lengthOverride: { chairMinutes, reason: 'short check' } })
    expect(shortened.status, JSON.stringify(shortened.body)).toBe(200)
  }
  visits[key] = { id: booked.body.id, name: NAMES[patientIndex]!.join(' ') }
}

beforeAll(async () => {
  annex = await createAnnex({ rooms: 3, providers: 1, patients: 4, timeZone: middayZone() })
  for (const [index, [first, last]] of NAMES.entries()) await testDb()('patients').where({ id: annex.patientIds[index] }).update({ first_name: first, last_name: last })
  deskEmail = (await createStaff('front_desk', [annex.siteId])).email
  dentistEmail = (await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('providers.id', annex.providerIds[0]).first('users.email')).email
  const start = startIn(40)
  // Chair 1: a 15-minute then a 20-minute sealant, back to back (the work itself takes 14 minutes).
  await book('fifteen', 0, 0, start, [{ templateCode: 'SEAL', tooth: '3' }], 15)
  await book('twenty', 1, 0, plus(start, 15), [{ templateCode: 'SEAL', tooth: '14' }], 20)
  // Chair 2: a 30-minute sealant with tooth and surface, overlapping the 20-minute visit in time (the
  // dentist's hands are free by then): side by side on the dentist's week.
  await book('thirty', 2, 1, plus(start, 25), [{ templateCode: 'SEAL', tooth: '30', surfaces: 'O' }], 30)
  // Chair 3: another sealant overlapping that one.
  await book('overlap', 3, 2, plus(start, 45), [{ templateCode: 'SEAL', tooth: '19' }])
})
afterAll(async () => { await closeTestDb() })

async function axeClean(page: Page, path: string) {
  const violations = unlisted(await runAxe(page), path, ALLOWED)
  expect(violations, violations.map((violation) => `${violation.rule} (${violation.help}) at ${violation.targets.slice(0, 3).join(', ')}`).join('; ')).toEqual([])
}

/** True when the element's whole box lies inside the box of `container` (nothing cut by its overflow). */
async function inside(page: Page, element: string, container: string): Promise<boolean> {
  return page.evaluate(([inner, outer]) => {
    const a = document.querySelector(inner)!.getBoundingClientRect()
    const b = document.querySelector(inner)!.closest(outer)!.getBoundingClientRect()
    return a.width > 0 && a.height > 0 && a.top >= b.top - 0.5 && a.bottom <= b.bottom + 0.5 && a.left >= b.left - 0.5 && a.right <= b.right + 0.5
  }, [element, container] as const)
}

/** The element the pointer would hit at the centre of `selector`'s box is the element itself (nothing covers it). */
async function onTop(page: Page, selector: string): Promise<boolean> {
  return page.evaluate((target) => {
    const element = document.querySelector(target)!
    const box = element.getBoundingClientRect()
    const hit = document.elementFromPoint(box.left + box.width / 2, box.top + box.height / 2)
    return hit !== null && (hit === element || element.contains(hit))
  }, selector)
}

for (const viewport of [{ width: 1440, height: 900 }, { width: 1024, height: 768 }]) {
  const size = `${viewport.width}x${viewport.height}`

  describe(`My day at ${size}`, () => {
    let browser: BrowserSession
    beforeAll(async () => {
      browser = await openBrowser(inject('baseURL'), viewport)
      await signInThroughForm(browser.page, dentistEmail, 'annex-provider-password')
      await browser.page.waitForURL(/\/my-day$/)
    })
    afterAll(async () => { await browser?.close() })

    it('keeps the next move ("Mark arrived") of a 15- and a 20-minute visit whole, uncovered and at least 24×24 px, and a press marks it', async () => {
      const { page } = browser
      for (const key of ['fifteen', 'twenty']) {
        const card = `[data-testid="myday-visit"][data-visit-id="${visits[key]!.id}"]`
        await page.locator(card).waitFor()
        expect(await page.locator(card).getAttribute('data-compact')).toBe('true')
        // The visit's next move: "Mark arrived", or after the other viewport pressed it "Start treatment".
        const buttonSelector = `${card} button[aria-label$=": ${visits[key]!.name}"]`
        const button = page.locator(buttonSelector)
        await button.scrollIntoViewIfNeeded()
        const box = (await button.boundingBox())!
        // WCAG 2.2 §2.5.8 Target Size (Minimum): at least 24 by 24 CSS pixels.
        expect(box.width).toBeGreaterThanOrEqual(24)
        expect(box.height).toBeGreaterThanOrEqual(24)
        expect(await inside(page, buttonSelector, '[data-testid="myday-visit"]')).toBe(true)
        expect(await onTop(page, buttonSelector)).toBe(true)
        expect(await button.isEnabled()).toBe(true)
      }
      // The two cards do not cover each other: side by side or one under the other.
      const first = (await page.locator(`[data-visit-id="${visits.fifteen!.id}"]`).boundingBox())!
      const second = (await page.locator(`[data-visit-id="${visits.twenty!.id}"]`).boundingBox())!
      const apart = first.y + first.height <= second.y + 0.5 || first.x + first.width <= second.x + 0.5 || second.x + second.width <= first.x + 0.5
      expect(apart).toBe(true)
      await page.locator(`[data-testid="myday-visit"][data-visit-id="${visits.fifteen!.id}"]`).screenshot({ path: `tests/artifacts/short-visits-myday-15-${size}.png` })
      await screenshot(page, `short-visits-myday-${size}`)
      await axeClean(page, '/my-day')
      // The first viewport presses the 15-minute visit's button, the second the 20-minute one's.
      const key = viewport.width === 1440 ? 'fifteen' : 'twenty'
      await page.locator(`[data-visit-id="${visits[key]!.id}"] button[aria-label^="Mark arrived: "]`).click()
      await expect.poll(async () => (await testDb()('visits').where({ id: visits[key]!.id }).first('state')).state).toBe('arrived')
      await expect.poll(() => page.locator(`[data-visit-id="${visits[key]!.id}"] [data-testid="visit-state"]`).getAttribute('data-state')).toBe('arrived')
    })
  })

  describe(`the Chairboard at ${size}`, () => {
    let browser: BrowserSession
    beforeAll(async () => {
      browser = await openBrowser(inject('baseURL'), viewport)
      await signInThroughForm(browser.page, deskEmail, STAFF_PASSWORD)
      await browser.page.waitForURL(/\/chairboard$/)
    })
    afterAll(async () => { await browser?.close() })

    it('shows name, tooth with surfaces and state inside a 30-minute visit\'s card, and the name of a 15-minute one', async () => {
      const { page } = browser
      const card = `[data-testid="visit-block"][data-visit-id="${visits.thirty!.id}"]`
      await page.locator(card).waitFor()
      await page.locator(card).scrollIntoViewIfNeeded()
      const harness = '.fc-timegrid-event'
      for (const part of ['[data-testid="visit-name"]', '[data-testid="visit-procedure"]', '[data-testid="visit-state"]']) {
        expect(await inside(page, `${card} ${part}`, harness), part).toBe(true)
      }
      expect(await page.locator(`${card} [data-testid="visit-name"]`).evaluate((element) => element.scrollWidth <= element.clientWidth + 1)).toBe(true)
      expect(await page.locator(`${card} [data-testid="visit-name"]`).textContent()).toBe(visits.thirty!.name)
      expect(await page.locator(`${card} [data-testid="visit-procedure"]`).textContent()).toMatch(/\b30 O\b/)
      expect(await page.locator(`${card} [data-testid="visit-procedure"]`).evaluate((element) => element.scrollWidth <= element.clientWidth + 1)).toBe(true)
      expect(await page.locator(`${card} [data-testid="visit-state"]`).textContent()).toContain('Booked')
      const tiny = `[data-testid="visit-block"][data-visit-id="${visits.fifteen!.id}"]`
      expect(await inside(page, `${tiny} [data-testid="visit-name"]`, harness)).toBe(true)
      expect(await page.locator(`${tiny} [data-testid="visit-name"]`).evaluate((element) => element.scrollWidth <= element.clientWidth + 1)).toBe(true)
      await page.locator(card).screenshot({ path: `tests/artifacts/short-visits-board-30-${size}.png` })
      await screenshot(page, `short-visits-board-${size}`)
      await axeClean(page, '/chairboard')
    })
  })

  describe(`the provider week at ${size}`, () => {
    let browser: BrowserSession
    beforeAll(async () => {
      browser = await openBrowser(inject('baseURL'), viewport)
      await signInThroughForm(browser.page, dentistEmail, 'annex-provider-password')
      await browser.page.waitForURL(/\/my-day$/)
      await browser.page.goto('/week/provider')
    })
    afterAll(async () => { await browser?.close() })

    it('lays overlapping visits side by side with every name whole', async () => {
      const { page } = browser
      const keys = ['fifteen', 'twenty', 'thirty', 'overlap'] as const
      for (const key of keys) await page.locator(`[data-testid="week-visit"][data-visit-id="${visits[key]!.id}"]`).waitFor()
      await page.locator(`[data-testid="week-visit"][data-visit-id="${visits.thirty!.id}"]`).scrollIntoViewIfNeeded()
      await page.getByTestId('week-grid').screenshot({ path: `tests/artifacts/short-visits-week-${size}.png` })
      const boxes = new Map<string, { x: number; y: number; width: number; height: number }>()
      for (const key of keys) {
        const card = `[data-testid="week-visit"][data-visit-id="${visits[key]!.id}"]`
        await page.locator(card).scrollIntoViewIfNeeded()
        boxes.set(key, (await page.locator(card).boundingBox())!)
        const name = page.locator(`${card} [data-testid="week-visit-name"]`)
        expect(await name.textContent()).toBe(visits[key]!.name)
        // Whole: not cut sideways, and every line of it inside the card (the card hides what overflows).
        expect(await name.evaluate((element) => element.scrollWidth <= element.clientWidth + 1)).toBe(true)
        expect(await inside(page, `${card} [data-testid="week-visit-name"]`, '[data-testid="week-visit"]'), key).toBe(true)
        // Each word on one line: never broken into a few letters per line.
        const lines = await name.evaluate((element) => {
          const range = document.createRange()
          range.selectNodeContents(element)
          return new Set([...range.getClientRects()].map((rect) => Math.round(rect.top))).size
        })
        expect(lines, key).toBeLessThanOrEqual(NAMES[keys.indexOf(key)]!.length)
      }
      // The overlapping pairs are side by side: they share time but not space.
      const sideBySide = (a: string, b: string) => {
        const one = boxes.get(a)!
        const two = boxes.get(b)!
        return one.x + one.width <= two.x + 0.5 || two.x + two.width <= one.x + 0.5
      }
      expect(sideBySide('twenty', 'thirty')).toBe(true)
      expect(sideBySide('thirty', 'overlap')).toBe(true)
      await axeClean(page, '/week/provider')
    })
  })
}
