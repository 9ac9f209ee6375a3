// Default chair-time templates: starting points the practice changes (sources in data/procedure-templates.ts).
// Stored through the same repository the Templates screen uses.
import { DEFAULT_TEMPLATES } from './data/procedure-templates'
import { insertFirstVersion } from '../server/repositories/templates'
import type { SeedContext } from './context'

export async function seedTemplates(ctx: SeedContext): Promise<void> {
  for (const template of DEFAULT_TEMPLATES) await insertFirstVersion(ctx.db, template, null)
}
