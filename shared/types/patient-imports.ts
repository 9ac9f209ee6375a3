// The CSV import's answers (issue 16 §3).
import type { ColumnMapping } from '../domain/patient-import'
import type { DateOrder } from './display'
import type { DuplicateCandidateDto } from './patients'

export interface ImportUploadDto {
  id: number
  fileName: string
  headers: string[]
  rowCount: number
  /** The first rows as they are in the file. */
  sample: string[][]
  /** The site's remembered mapping where it still fits, else a guess from the headers. */
  mapping: ColumnMapping
  dateOrder: DateOrder
  /** The same file (by checksum) was imported at this site before. */
  alreadyImported: { importId: number; importedAt: string } | null
}

export type ImportChoice = 'skip' | 'merge' | 'create'

export interface ImportPreviewRow {
  /** The line of the file the row starts on (the header is line 1). */
  line: number
  name: string
  dateOfBirth: string
  errors: string[]
  /** Likely duplicates already in the database. */
  duplicates: DuplicateCandidateDto[]
  /** An earlier line of the same file that is likely the same person. */
  sameAsLine: number | null
  /** What happens unless the screen chooses otherwise. */
  choice: ImportChoice | 'fail'
}

export interface ImportPreviewDto {
  id: number
  rows: ImportPreviewRow[]
  counts: { valid: number; failed: number; duplicates: number }
  alreadyImported: ImportUploadDto['alreadyImported']
}

export type ImportOutcome = 'created' | 'merged' | 'skipped' | 'failed'

export interface ImportReportRow {
  line: number
  outcome: ImportOutcome
  patientId: number | null
  note: string
}

export interface ImportReportDto {
  id: number
  counts: Record<ImportOutcome, number>
  rows: ImportReportRow[]
}
