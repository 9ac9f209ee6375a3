// Debian's Chromium driven by playwright-core (no browser download), fresh profile each launch.
import { mkdtempSync, mkdirSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { chromium, type BrowserContext, type Page } from 'playwright-core'

const FLAGS = [
  '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync',
]

export const ARTIFACTS = join(process.cwd(), 'tests', 'artifacts')

export interface BrowserSession {
  context: BrowserContext
  page: Page
  close: () => Promise<void>
}

export async function openBrowser(baseURL: string, viewport = { width: 1280, height: 800 }): Promise<BrowserSession> {
  const profile = mkdtempSync(join(tmpdir(), 'cuspline-chromium-'))
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: FLAGS,
    headless: true,
    baseURL,
    viewport,
    timezoneId: 'UTC',
  })
  const page = context.pages()[0] ?? await context.newPage()
  return { context, page, close: () => context.close() }
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(ARTIFACTS, { recursive: true })
  const path = join(ARTIFACTS, `${name}.png`)
  await page.screenshot({ path, fullPage: true })
  return path
}

export async function signInThroughForm(page: Page, email: string, password = 'cuspline-demo'): Promise<void> {
  await page.goto('/sign-in')
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
}

export type { Page }
