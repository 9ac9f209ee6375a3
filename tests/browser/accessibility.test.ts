// Every screen checked by axe-core for WCAG 2.2 level A and AA (issue 14), signed in as a role that
// sees it, at 1440×900 (desktop) and 1024×768 (tablet). Any violation not listed, with a reason, in
// tests/browser/axe-allow-list.json fails the test. Source: WCAG 2.2 (W3C Recommendation), through
// axe-core's rules tagged wcag2a, wcag2aa, wcag21a, wcag21aa, wcag22aa.
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession, type Page } from '../helpers/browser'
import { runAxe, unlisted, type AllowedViolation } from '../helpers/axe'
import { signedInAs } from '../helpers/api-client'
import { bookingFor, createMailAnnex, type MailAnnex } from '../helpers/mail-fixtures'
import { outboxRowsOf } from '../helpers/mail-fixtures'
import { atAhead, TUESDAY } from '../helpers/dates'

const ALLOWED = JSON.parse(readFileSync(join(process.cwd(), 'tests', 'browser', 'axe-allow-list.json'), 'utf8')) as AllowedViolation[]
const VIEWPORTS = [{ name: 'desktop', width: 1440, height: 900 }, { name: 'tablet', width: 1024, height: 768 }] as const

// Each screen with the account that sees it and what shows it has drawn.
const SCREENS: Array<{ path: string; as: string; ready: string }> = [
  { path: '/chairboard', as: 'desk.quarry@fernhollow.test', ready: '.fc-col-header-cell' },
  { path: '/week/provider', as: 'manager@fernhollow.test', ready: '[data-testid="week-label"]' },
  { path: '/week/operatory', as: 'manager@fernhollow.test', ready: '[data-testid="week-label"]' },
  { path: '/templates', as: 'manager@fernhollow.test', ready: 'table' },
  { path: '/rota', as: 'manager@fernhollow.test', ready: 'h1' },
  { path: '/balance', as: 'manager@fernhollow.test', ready: '[data-testid="balance-site"]' },
  { path: '/patients', as: 'desk.quarry@fernhollow.test', ready: 'h1' },
  { path: '/outbox', as: 'desk.quarry@fernhollow.test', ready: '[data-testid="outbox-table"]' },
  { path: '/waitlist', as: 'desk.quarry@fernhollow.test', ready: '[data-testid="waitlist-rows"], [data-testid="waitlist-empty"]' },
  { path: '/recall', as: 'desk.quarry@fernhollow.test', ready: '[data-testid="recall-rows"], [data-testid="recall-empty"]' },
  { path: '/sites', as: 'admin@fernhollow.test', ready: 'h1' },
  { path: '/people', as: 'admin@fernhollow.test', ready: 'h1' },
  { path: '/my-day', as: 'dentist@fernhollow.test', ready: '[data-testid="myday-site"]' },
]

let browser: BrowserSession
let annex: MailAnnex
let visitPath: string

beforeAll(async () => {
  // The patient's visit page needs a signed link: book at a private annex and take it from the e-mail.
  annex = await createMailAnnex({ patients: 1 })
  const manager = await signedInAs('manager@fernhollow.test')
  const booked = await manager.post('/api/visits', bookingFor(annex, 0, atAhead(3, TUESDAY, '10:00', annex.timeZone)))
  expect(booked.status).toBe(201)
  const invitation = (await outboxRowsOf(booked.body.id)).find((row) => row.kind === 'invitation')!
  const detail = await manager.get(`/api/outbox/${invitation.id}`)
  visitPath = /\/visit\/[^\s)"<]+/.exec(detail.body.rendered.text)![0]
  browser = await openBrowser(inject('baseURL'))
})
afterAll(async () => { await browser?.close() })

async function check(page: Page, path: string, name: string) {
  const violations = unlisted(await runAxe(page), path, ALLOWED)
  await screenshot(page, `axe-${name}`)
  expect(violations, `${path}: ${violations.map((violation) => `${violation.rule} (${violation.help}) at ${violation.targets.slice(0, 3).join(', ')}`).join('; ')}`).toEqual([])
}

describe('axe-core: WCAG 2.2 A and AA on every screen', () => {
  for (const viewport of VIEWPORTS) {
    it(`finds nothing unlisted signed out (sign-in, a patient's visit page) at ${viewport.width}×${viewport.height}`, async () => {
      const { page, context } = browser
      await context.clearCookies()
      await page.setViewportSize(viewport)
      await page.goto('/sign-in')
      await page.getByRole('button', { name: 'Sign in' }).waitFor()
      await check(page, '/sign-in', `sign-in-${viewport.name}`)
      await page.goto(visitPath)
      await page.getByTestId('visit-when').waitFor()
      await check(page, '/visit', `visit-page-${viewport.name}`)
    })

    for (const screen of SCREENS) {
      it(`finds nothing unlisted on ${screen.path} at ${viewport.width}×${viewport.height}`, async () => {
        const { page, context } = browser
        await context.clearCookies()
        await page.setViewportSize(viewport)
        await signInThroughForm(page, screen.as)
        await page.waitForURL((url) => url.pathname !== '/sign-in')
        await page.goto(screen.path)
        await page.locator(screen.ready).first().waitFor()
        await check(page, screen.path, `${screen.path.slice(1).replace('/', '-')}-${viewport.name}`)
      })
    }
  }
})
