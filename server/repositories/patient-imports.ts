// CSV imports of patients: the uploaded file, its report, and each site's remembered column mapping.
import type { Db } from '../utils/db'
import type { ColumnMapping } from '#shared/domain/patient-import'
import type { DateOrder } from '#shared/types/display'
import type { ImportReportDto } from '#shared/types/patient-imports'
import { parseJson } from './json'

export interface ImportRow {
  id: number
  site_id: number
  user_id: number | null
  file_name: string
  checksum: string
  content: string
  state: 'uploaded' | 'imported'
  report: unknown
  created_at: Date
  imported_at: Date | null
}

export async function insertImport(db: Db, upload: { siteId: number; userId: number; fileName: string; checksum: string; content: string }): Promise<number> {
  const [id] = await db('patient_imports').insert({
    site_id: upload.siteId, user_id: upload.userId, file_name: upload.fileName, checksum: upload.checksum, content: upload.content,
  })
  return id as number
}

export async function findImport(db: Db, id: number, forUpdate = false): Promise<ImportRow | undefined> {
  const query = db<ImportRow>('patient_imports').where({ id }).first()
  if (forUpdate) query.forUpdate()
  return query
}

/** The earlier import of the same file (by checksum) at the site, if one was carried out. */
export async function findImportedFile(db: Db, siteId: number, checksum: string): Promise<{ id: number; imported_at: Date } | undefined> {
  return db('patient_imports').where({ site_id: siteId, checksum, state: 'imported' }).orderBy('id').first('id', 'imported_at')
}

export async function markImported(db: Db, id: number, report: ImportReportDto): Promise<void> {
  await db('patient_imports').where({ id }).update({ state: 'imported', report: JSON.stringify(report), imported_at: db.fn.now(3) })
}

export function importReport(row: ImportRow): ImportReportDto | null {
  return row.report === null ? null : parseJson<ImportReportDto | null>(row.report, null)
}

export interface StoredMapping { mapping: ColumnMapping; dateOrder: DateOrder }

export async function findMapping(db: Db, siteId: number): Promise<StoredMapping | undefined> {
  const row = await db('patient_import_mappings').where({ site_id: siteId }).first('mapping')
  return row ? parseJson<StoredMapping | undefined>(row.mapping, undefined) : undefined
}

export async function saveMapping(db: Db, siteId: number, stored: StoredMapping): Promise<void> {
  await db('patient_import_mappings').insert({ site_id: siteId, mapping: JSON.stringify(stored) })
    .onConflict('site_id').merge({ mapping: JSON.stringify(stored), updated_at: db.fn.now(3) })
}

/** Inserts the rows in batches; MariaDB gives a multi-row INSERT consecutive ids from the first one. */
export async function insertPatientRows(db: Db, rows: Record<string, unknown>[], batch = 500): Promise<number[]> {
  const ids: number[] = []
  for (let start = 0; start < rows.length; start += batch) {
    const chunk = rows.slice(start, start + batch)
    const [first] = await db('patients').insert(chunk)
    for (let index = 0; index < chunk.length; index += 1) ids.push((first as number) + index)
  }
  return ids
}
