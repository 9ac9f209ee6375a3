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
    env: browserEnv(),
  })
  // Under `npm run test:future` this process's clock is moved by libfaketime, which Chromium does not
  // survive; Chromium runs on the real clock and its pages are given this process's time instead.
  if (process.env.FAKETIME) await context.clock.install({ time: Date.now() })
  const page = context.pages()[0] ?? await context.newPage()
  return { context, page, close: () => context.close() }
}

/** Chromium's environment: this process's, without libfaketime (Chromium hangs with it preloaded). */
function browserEnv(): Record<string, string> {
  const env: Record<string, string> = {}
  for (const [name, value] of Object.entries(process.env)) {
    if (value !== undefined && !name.startsWith('FAKETIME')) env[name] = value
  }
  const preload = (env.LD_PRELOAD ?? '').split(/[:\s]+/).filter((lib) => lib && !lib.includes('libfaketime'))
  if (preload.length) env.LD_PRELOAD = preload.join(':')
  else delete env.LD_PRELOAD
  return env
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
