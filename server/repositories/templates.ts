// Chair-time templates: one row per version; only the newest version of a code is current.
import type { Db } from '../utils/db'
import type { ChairTimeTemplate } from '#shared/types/chair-time'
import type { StoredTemplate } from '#shared/types/templates'
import { parseJson } from './json'
import { inOneTrip, rowsOf, statement, type Statement } from './round-trip'

interface TemplateRow {
  id: number
  code: string
  version: number
  name: string
  category: ChairTimeTemplate['category']
  capability: ChairTimeTemplate['capability']
  needs_tooth: number | null
  needs_surfaces: number | null
  region: 'anterior' | 'posterior' | null
  steps: string
  anaesthesia: string
  is_current: number
  active: number
  created_at: Date
}

function toTemplate(row: TemplateRow): StoredTemplate {
  return {
    id: row.id,
    code: row.code,
    version: row.version,
    name: row.name,
    category: row.category,
    capability: row.capability,
    ...(row.needs_tooth === null ? {} : { needsTooth: Boolean(row.needs_tooth) }),
    ...(row.needs_surfaces === null ? {} : { needsSurfaces: Boolean(row.needs_surfaces) }),
    ...(row.region === null ? {} : { region: row.region }),
    steps: parseJson(row.steps, []),
    anaesthesia: parseJson(row.anaesthesia, {} as ChairTimeTemplate['anaesthesia']),
    current: Boolean(row.is_current),
    active: Boolean(row.active),
    createdAt: row.created_at.toISOString(),
  }
}

function toRow(template: ChairTimeTemplate) {
  return {
    code: template.code,
    name: template.name,
    category: template.category,
    capability: template.capability,
    needs_tooth: template.needsTooth ?? null,
    needs_surfaces: template.needsSurfaces ?? null,
    region: template.region ?? null,
    steps: JSON.stringify(template.steps),
    anaesthesia: JSON.stringify(template.anaesthesia),
  }
}

export async function listCurrentTemplates(db: Db, options: { includeInactive?: boolean } = {}): Promise<StoredTemplate[]> {
  const query = db<TemplateRow>('procedure_templates').where('is_current', true).orderBy(['category', 'name'])
  if (!options.includeInactive) query.where('active', true)
  return (await query).map(toTemplate)
}

export async function findTemplateById(db: Db, id: number): Promise<StoredTemplate | undefined> {
  const [template] = await inOneTrip(db, [templateStatement(db, { id })])
  return template
}

export async function findCurrentTemplateByCode(db: Db, code: string): Promise<StoredTemplate | undefined> {
  const [template] = await inOneTrip(db, [templateStatement(db, { code })])
  return template
}

/** A plan item's template, by id or by code (its current version), as a statement for one round trip with others. */
export function templateStatement(db: Db, ref: { id: number } | { code: string }): Statement<StoredTemplate | undefined> {
  const query = 'id' in ref
    ? db<TemplateRow>('procedure_templates').where({ id: ref.id }).first()
    : db<TemplateRow>('procedure_templates').where('code', ref.code).where('is_current', true).first()
  return statement(query, (answer) => {
    const row = rowsOf<TemplateRow>(answer)[0]
    return row ? toTemplate(row) : undefined
  })
}

/** The given version of a code, or its current version when none is given (a visit's stored plan). */
export async function findTemplateByCode(db: Db, code: string, version: number | undefined): Promise<StoredTemplate | undefined> {
  const query = db<TemplateRow>('procedure_templates').where('code', code)
  const row = await (version ? query.where('version', version) : query.where('is_current', true)).first()
  return row ? toTemplate(row) : undefined
}

export async function codeExists(db: Db, code: string): Promise<boolean> {
  return Boolean(await db('procedure_templates').where({ code }).first('id'))
}

/** Inserts version 1 of a new code. */
export async function insertFirstVersion(db: Db, template: ChairTimeTemplate, userId: number | null): Promise<number> {
  const [id] = await db('procedure_templates').insert({ ...toRow(template), version: 1, created_by: userId })
  return id as number
}

/** Saves an edit as the next version of the code and makes it current. Call inside a transaction. */
export async function insertNextVersion(db: Db, code: string, template: ChairTimeTemplate, userId: number | null): Promise<number> {
  // Locks the code's rows so two simultaneous edits get consecutive versions.
  const latest = await db('procedure_templates').where({ code }).orderBy('version', 'desc').forUpdate().first('version', 'active')
  await db('procedure_templates').where({ code }).update({ is_current: false })
  const [id] = await db('procedure_templates').insert({
    ...toRow({ ...template, code }), version: (latest?.version ?? 0) + 1, created_by: userId, active: latest?.active ?? true,
  })
  return id as number
}

export async function setCodeActive(db: Db, code: string, active: boolean): Promise<void> {
  await db('procedure_templates').where({ code }).update({ active })
}
