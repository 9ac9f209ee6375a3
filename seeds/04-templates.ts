// Default chair-time templates: starting points the practice changes (sources in data/procedure-templates.ts).
import { DEFAULT_TEMPLATES } from './data/procedure-templates'
import type { SeedContext } from './context'

export async function seedTemplates(ctx: SeedContext): Promise<void> {
  await ctx.db('procedure_templates').insert(DEFAULT_TEMPLATES.map((template) => ({
    code: template.code,
    version: 1,
    name: template.name,
    category: template.category,
    capability: template.capability,
    needs_tooth: template.needsTooth ?? null,
    needs_surfaces: template.needsSurfaces ?? null,
    region: template.region ?? null,
    steps: JSON.stringify(template.steps),
    anaesthesia: JSON.stringify(template.anaesthesia),
  })))
}
