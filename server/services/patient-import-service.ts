// Importing patients from CSV (issue 16 §3): upload → map columns → preview → import in one
// transaction → report. Re-importing the same file creates nothing: a file whose checksum was already
// imported at the site is reported as skipped, and rows matching records already there are skipped
// unless the screen chose otherwise.
import { createHash } from 'node:crypto'
import type { SessionUser } from '#shared/types/auth'
import type { ImportChoice, ImportPreviewDto, ImportPreviewRow, ImportReportDto, ImportReportRow, ImportUploadDto } from '#shared/types/patient-imports'
import type { ImportMappingInput, ImportRunInput, ImportUploadInput } from '#shared/schemas/patient-imports'
import type { PatientFieldsInput } from '#shared/schemas/patients'
import { guessMapping, MAX_IMPORT_BYTES, MAX_IMPORT_ROWS, parseCsv, rowToFields, type ParsedCsv } from '#shared/domain/patient-import'
import { DuplicateIndex, type PatientIdentity } from '#shared/domain/patient-duplicates'
import { requireSiteAccess } from '../utils/auth'
import { useDb, type Db } from '../utils/db'
import { inTransaction } from '../utils/db-retry'
import { badRequest, notFound } from '../utils/errors'
import { duplicateCandidates, fillPatientBlanks, findPatientRow, patientColumns } from '../repositories/patients'
import { findImport, findImportedFile, findMapping, importReport, insertImport, insertPatientRows, markImported, saveMapping, type ImportRow } from '../repositories/patient-imports'
import { findSite } from '../repositories/sites'
import { writeAudit } from '../repositories/audit-log'

function tooLarge() {
  return createError({ statusCode: 413, statusMessage: 'Payload Too Large', message: 'The file is too large: at most 10 MB is accepted.' })
}

/** The import, if the caller may use it (its site is one of theirs). */
async function importFor(db: Db, user: SessionUser, id: number, forUpdate = false): Promise<ImportRow> {
  const row = await findImport(db, id, forUpdate)
  if (!row) throw notFound('No such import.')
  requireSiteAccess(user, row.site_id)
  return row
}

function readFile(text: string): ParsedCsv {
  const parsed = parseCsv(text)
  if (!parsed.headers.length || !parsed.headers.some(Boolean)) throw badRequest('csv', 'has no header row')
  if (!parsed.rows.length) throw badRequest('csv', 'has a header row but no patients')
  if (parsed.rows.length > MAX_IMPORT_ROWS) throw badRequest('csv', `has more than ${MAX_IMPORT_ROWS} rows; split the file`)
  return parsed
}

const checksumOf = (text: string) => createHash('sha256').update(text.replace(/^\uFEFF/, ''), 'utf8').digest('hex')

export async function uploadImport(user: SessionUser, input: ImportUploadInput): Promise<ImportUploadDto> {
  requireSiteAccess(user, input.siteId)
  if (Buffer.byteLength(input.csv, 'utf8') > MAX_IMPORT_BYTES) throw tooLarge()
  const parsed = readFile(input.csv)
  const checksum = checksumOf(input.csv)
  return inTransaction(async (trx) => {
    if (!(await findSite(trx, input.siteId))) throw badRequest('siteId', 'is not a site')
    const id = await insertImport(trx, { siteId: input.siteId, userId: user.id, fileName: input.fileName, checksum, content: input.csv })
    const earlier = await findImportedFile(trx, input.siteId, checksum)
    const stored = await findMapping(trx, input.siteId)
    return {
      id, fileName: input.fileName, headers: parsed.headers, rowCount: parsed.rows.length, sample: parsed.rows.slice(0, 5),
      mapping: guessMapping(parsed.headers, stored?.mapping), dateOrder: stored?.dateOrder ?? 'month-day-year',
      alreadyImported: earlier ? { importId: earlier.id, importedAt: earlier.imported_at.toISOString() } : null,
    }
  })
}

interface PlannedRow extends ImportPreviewRow {
  fields: PatientFieldsInput | null
}

/** Every row read with the mapping, checked, and matched against the database and earlier rows. */
async function planRows(db: Db, content: string, mapping: ImportMappingInput): Promise<PlannedRow[]> {
  const parsed = readFile(content)
  const missing = (['firstName', 'lastName', 'dateOfBirth'] as const).filter((field) => !mapping.mapping[field])
  if (missing.length) throw badRequest(`mapping.${missing[0]}`, 'choose the column that holds it')
  const read = parsed.rows.map((row, index) => ({ line: parsed.lines[index]!, result: rowToFields(parsed.headers, row, mapping.mapping, mapping.dateOrder) }))
  const people = read.flatMap((row) => (row.result.ok ? [row.result.fields] : []))
  const inDatabase = new DuplicateIndex(await duplicateCandidates(db, people.map((person) => ({ email: person.email, phone: person.phone, dateOfBirth: person.dateOfBirth }))))
  const inFile = new DuplicateIndex<PatientIdentity & { line: number }>()
  return read.map(({ line, result }): PlannedRow => {
    if (!result.ok) return { line, name: '', dateOfBirth: '', errors: result.errors, duplicates: [], sameAsLine: null, choice: 'fail', fields: null }
    const person: PatientIdentity = { firstName: result.fields.firstName, lastName: result.fields.lastName, dateOfBirth: result.fields.dateOfBirth, email: result.fields.email ?? null, phone: result.fields.phone ?? null }
    const duplicates = inDatabase.match(person).slice(0, 5).map((match) => ({ patient: match.candidate, reasons: match.reasons }))
    const sameAsLine = inFile.match(person)[0]?.candidate.line ?? null
    inFile.add({ ...person, line })
    return {
      line, name: `${person.firstName} ${person.lastName}`, dateOfBirth: person.dateOfBirth, errors: [], duplicates, sameAsLine,
      choice: duplicates.length || sameAsLine !== null ? 'skip' : 'create', fields: result.fields,
    }
  })
}

export async function previewImport(user: SessionUser, id: number, input: ImportMappingInput): Promise<ImportPreviewDto> {
  const db = useDb()
  const upload = await importFor(db, user, id)
  const rows = await planRows(db, upload.content, input)
  await saveMapping(db, upload.site_id, { mapping: input.mapping, dateOrder: input.dateOrder })
  const earlier = await findImportedFile(db, upload.site_id, upload.checksum)
  return {
    id,
    rows: rows.map(({ fields: _fields, ...row }) => row),
    counts: {
      valid: rows.filter((row) => row.choice !== 'fail').length,
      failed: rows.filter((row) => row.choice === 'fail').length,
      duplicates: rows.filter((row) => row.duplicates.length || row.sameAsLine !== null).length,
    },
    alreadyImported: earlier ? { importId: earlier.id, importedAt: earlier.imported_at.toISOString() } : null,
  }
}

/** The existing record's empty fields filled from the row (a merge of an imported row never overwrites). */
function fillBlanks(existing: Record<string, unknown>, incoming: Record<string, unknown>): Record<string, unknown> {
  const fill: Record<string, unknown> = {}
  for (const [column, value] of Object.entries(incoming)) {
    const blank = existing[column] === null || existing[column] === '' || existing[column] === undefined
    if (blank && value !== null && value !== '' && !['email_consent', 'sms_consent'].includes(column)) fill[column] = value
  }
  return fill
}

function countOf(rows: ImportReportRow[]): ImportReportDto['counts'] {
  const counts = { created: 0, merged: 0, skipped: 0, failed: 0 }
  for (const row of rows) counts[row.outcome] += 1
  return counts
}

/** Carries out the import in one transaction: every row's outcome, or nothing at all. */
export async function runImport(user: SessionUser, id: number, input: ImportRunInput, ip: string): Promise<ImportReportDto> {
  const db = useDb()
  const upload = await importFor(db, user, id)
  if (upload.state === 'imported') return importReport(upload)!
  const planned = await planRows(db, upload.content, input)
  return inTransaction(async (trx) => {
    const locked = await importFor(trx, user, id, true)
    if (locked.state === 'imported') return importReport(locked)!
    const earlier = await findImportedFile(trx, upload.site_id, upload.checksum)
    const report: ImportReportRow[] = []
    if (earlier) {
      for (const row of planned) report.push({ line: row.line, outcome: 'skipped', patientId: null, note: `this file was imported already (import ${earlier.id}, ${earlier.imported_at.toISOString().slice(0, 10)})` })
    } else {
      const toCreate: { row: PlannedRow; columns: Record<string, unknown> }[] = []
      const fileMerges: { row: PlannedRow; columns: Record<string, unknown> }[] = []
      const now = new Date()
      for (const row of planned) {
        if (!row.fields) { report.push({ line: row.line, outcome: 'failed', patientId: null, note: row.errors.join('; ') }); continue }
        const columns = {
          ...patientColumns(row.fields), preferred_site_id: upload.site_id,
          email_consent_at: row.fields.emailConsent ? now : null, email_consent_source: row.fields.emailConsent ? 'import' : null,
          sms_consent_at: row.fields.smsConsent ? now : null, sms_consent_source: row.fields.smsConsent ? 'import' : null,
        }
        const choice: ImportChoice = input.choices[String(row.line)] ?? (row.choice === 'fail' ? 'skip' : row.choice)
        const duplicate = row.duplicates[0]?.patient
        if (choice === 'create' || (!duplicate && row.sameAsLine === null)) { toCreate.push({ row, columns }); continue }
        if (choice === 'skip') {
          report.push({ line: row.line, outcome: 'skipped', patientId: duplicate?.id ?? null, note: duplicate ? `likely the same as patient ${duplicate.id}` : `likely the same as line ${row.sameAsLine}` })
          continue
        }
        if (duplicate) {
          const existing = await findPatientRow(trx, duplicate.id, true)
          const fill = fillBlanks({ ...existing }, columns)
          if (Object.keys(fill).length) await fillPatientBlanks(trx, duplicate.id, fill)
          report.push({ line: row.line, outcome: 'merged', patientId: duplicate.id, note: Object.keys(fill).length ? `filled ${Object.keys(fill).join(', ')}` : 'nothing new' })
        } else {
          fileMerges.push({ row, columns })
        }
      }
      const ids = await insertPatientRows(trx, toCreate.map((entry) => entry.columns))
      const idByLine = new Map<number, number>()
      toCreate.forEach((entry, index) => {
        idByLine.set(entry.row.line, ids[index]!)
        report.push({ line: entry.row.line, outcome: 'created', patientId: ids[index]!, note: '' })
      })
      for (const { row, columns } of fileMerges) {
        const target = idByLine.get(row.sameAsLine!)
        if (target === undefined) { report.push({ line: row.line, outcome: 'skipped', patientId: null, note: `line ${row.sameAsLine} was not created, so there is nothing to merge into` }); continue }
        const existing = await findPatientRow(trx, target, true)
        const fill = fillBlanks({ ...existing }, columns)
        if (Object.keys(fill).length) await fillPatientBlanks(trx, target, fill)
        report.push({ line: row.line, outcome: 'merged', patientId: target, note: `merged into line ${row.sameAsLine}` })
      }
    }
    report.sort((a, b) => a.line - b.line)
    const result: ImportReportDto = { id, counts: countOf(report), rows: report }
    await markImported(trx, id, result)
    await writeAudit(trx, { userId: user.id, action: 'patients_imported', entity: 'patient_import', entityId: id, after: { fileName: upload.file_name, siteId: upload.site_id, ...result.counts }, ip })
    return result
  }).catch((error: unknown) => {
    if (error && typeof error === 'object' && 'statusCode' in error) throw error
    // A row the database refused (a trigger, a constraint): the transaction rolled back.
    const said = (error as { sqlMessage?: unknown } | null)?.sqlMessage
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `Nothing was imported: the database refused a row${typeof said === 'string' ? ` (${said.slice(0, 200)})` : ''}. Fix the file or try again.`, data: { field: 'csv' } })
  })
}

/** The report of a finished import, for the CSV download. */
export async function importReportFor(user: SessionUser, id: number): Promise<{ fileName: string; report: ImportReportDto }> {
  const upload = await importFor(useDb(), user, id)
  const report = importReport(upload)
  if (!report) throw notFound('This file has not been imported yet.')
  return { fileName: upload.file_name, report }
}
