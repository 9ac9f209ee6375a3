// axe-core in real Chromium (issue 14): injects axe (npm axe-core) into the page and runs it with
// the WCAG 2.0, 2.1 and 2.2 level A and AA rules. The page's CSP (script-src with a nonce) does not
// apply: playwright evaluates the source through the DevTools protocol, not as a page <script>.
import axeCore from 'axe-core'
import type { Page } from 'playwright-core'

// axe-core's own copy of its browser script (the package's `source`).
const AXE_SOURCE = axeCore.source

/** axe-core's tags for WCAG 2.2 level A and AA (2.0, 2.1 and 2.2 success criteria). */
export const WCAG_22_AA_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa']

export interface AxeViolation {
  rule: string
  impact: string | null
  help: string
  /** CSS selectors of the offending elements. */
  targets: string[]
}

export async function runAxe(page: Page): Promise<AxeViolation[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(AXE_SOURCE)
  return page.evaluate(async (tags) => {
    const axe = (window as unknown as { axe: { run: (context: Document, options: unknown) => Promise<{ violations: Array<{ id: string; impact: string | null; help: string; nodes: Array<{ target: unknown[] }> }> }> } }).axe
    const result = await axe.run(document, { runOnly: { type: 'tag', values: tags }, resultTypes: ['violations'] })
    return result.violations.map((violation) => ({
      rule: violation.id, impact: violation.impact, help: violation.help,
      targets: violation.nodes.map((node) => node.target.map(String).join(' ')),
    }))
  }, WCAG_22_AA_TAGS)
}

export interface AllowedViolation {
  rule: string
  /** A path ('/chairboard') or '*' for every screen. */
  page: string
  /** Only these elements (a substring of axe's selector); every element when absent. */
  target?: string
  reason: string
}

/** The violations not covered by an allow-list entry, with the elements left after the allowed ones. */
export function unlisted(violations: AxeViolation[], path: string, allowed: AllowedViolation[]): AxeViolation[] {
  return violations
    .map((violation) => {
      const entries = allowed.filter((entry) => entry.rule === violation.rule && (entry.page === '*' || entry.page === path))
      const targets = violation.targets.filter((target) => !entries.some((entry) => entry.target === undefined || target.includes(entry.target)))
      return { ...violation, targets }
    })
    .filter((violation) => violation.targets.length > 0)
}
