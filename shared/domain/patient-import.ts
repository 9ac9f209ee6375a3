// Importing patients from a CSV file (issue 16 §3): reading the file (papaparse; UTF-8 with or
// without a byte-order mark; comma or semicolon; quoted fields may hold line breaks), guessing which
// column holds which field, and turning one row into a record's fields or errors in words.
import Papa from 'papaparse'
import { PatientFieldsSchema, type PatientFieldsInput } from '../schemas/patients'
import type { DateOrder } from '../types/display'
import { formatLocalDate, parseDateInput } from '../utils/display-time'

export const MAX_IMPORT_BYTES = 10 * 1024 * 1024
export const MAX_IMPORT_ROWS = 20_000

export const IMPORT_FIELDS = [
  'firstName', 'lastName', 'preferredName', 'dateOfBirth', 'email', 'phone', 'addressStreet', 'addressCity', 'addressRegion',
  'addressPostalCode', 'emailConsent', 'smsConsent', 'guardianName', 'guardianEmail', 'guardianPhone', 'frontDeskNote', 'alertText',
] as const
export type ImportField = (typeof IMPORT_FIELDS)[number]
export type ColumnMapping = Partial<Record<ImportField, string>>

export const IMPORT_FIELD_LABELS: Record<ImportField, string> = {
  firstName: 'Given name', lastName: 'Family name', preferredName: 'Preferred name', dateOfBirth: 'Birth date', email: 'E-mail',
  phone: 'Mobile phone', addressStreet: 'Street', addressCity: 'Town or city', addressRegion: 'State or region', addressPostalCode: 'Postal code',
  emailConsent: 'Agrees to e-mail (yes/no)', smsConsent: 'Agrees to texts (yes/no)', guardianName: 'Guardian\'s name',
  guardianEmail: 'Guardian\'s e-mail', guardianPhone: 'Guardian\'s phone', frontDeskNote: 'Front desk note', alertText: 'Alert',
}

/** Header words that usually mean a field (folded: lower case, letters and digits only). */
const HEADER_WORDS: Record<ImportField, string[]> = {
  firstName: ['firstname', 'givenname', 'given', 'first', 'forename'],
  lastName: ['lastname', 'familyname', 'surname', 'family', 'last'],
  preferredName: ['preferredname', 'preferred', 'nickname', 'knownas'],
  dateOfBirth: ['dateofbirth', 'birthdate', 'dob', 'born', 'birthday'],
  email: ['email', 'emailaddress', 'mail'],
  phone: ['phone', 'mobile', 'mobilephone', 'cell', 'telephone', 'tel'],
  addressStreet: ['street', 'address', 'addressline1', 'streetaddress'],
  addressCity: ['city', 'town'],
  addressRegion: ['state', 'region', 'province', 'county'],
  addressPostalCode: ['postalcode', 'postcode', 'zip', 'zipcode'],
  emailConsent: ['emailconsent', 'agreestoemail', 'emailok'],
  smsConsent: ['smsconsent', 'textconsent', 'agreestotexts', 'smsok'],
  guardianName: ['guardianname', 'guardian', 'parent'],
  guardianEmail: ['guardianemail', 'parentemail'],
  guardianPhone: ['guardianphone', 'parentphone'],
  frontDeskNote: ['note', 'notes', 'frontdesknote', 'comment'],
  alertText: ['alert', 'medicalalert', 'flag'],
}
const fold = (header: string) => header.toLowerCase().replace(/[^a-z0-9]/g, '')

export interface ParsedCsv {
  headers: string[]
  /** Data rows (the header row left out), each with as many cells as it had. */
  rows: string[][]
  /** The line of the file each data row starts on (the header is line 1), for messages. */
  lines: number[]
}

/** Reads CSV text: a BOM is dropped, the delimiter (comma or semicolon) found, quoted line breaks kept. */
export function parseCsv(text: string): ParsedCsv {
  const withoutBom = text.replace(/^\uFEFF/, '')
  const result = Papa.parse<string[]>(withoutBom, { delimiter: '', delimitersToGuess: [',', ';'], skipEmptyLines: 'greedy' })
  const [headers = [], ...rows] = result.data
  // Line numbers: count the line breaks inside each row's cells (a quoted field may hold some).
  const lines: number[] = []
  let line = 2 + (headers.join('').match(/\n/g)?.length ?? 0)
  for (const row of rows) {
    lines.push(line)
    line += 1 + (row.join('').match(/\n/g)?.length ?? 0)
  }
  return { headers: headers.map((header) => header.trim()), rows, lines }
}

/** The remembered mapping where its headers are still there, otherwise a guess from the header words. */
export function guessMapping(headers: readonly string[], remembered: ColumnMapping = {}): ColumnMapping {
  const mapping: ColumnMapping = {}
  const taken = new Set<string>()
  for (const field of IMPORT_FIELDS) {
    const header = remembered[field]
    if (header && headers.includes(header)) { mapping[field] = header; taken.add(header) }
  }
  for (const field of IMPORT_FIELDS) {
    if (mapping[field]) continue
    const found = headers.find((header) => !taken.has(header) && HEADER_WORDS[field].includes(fold(header)))
    if (found) { mapping[field] = found; taken.add(found) }
  }
  return mapping
}

const YES = new Set(['yes', 'y', 'true', '1', 'x', 'ja', 'oui', 'si', 'sí'])
const NO = new Set(['no', 'n', 'false', '0', '', 'nein', 'non'])

export type RowResult = { ok: true; fields: PatientFieldsInput } | { ok: false; errors: string[] }

/** One row as a record's fields, or every problem in words ("Birth date: 31/02/1980 is not a date…"). */
export function rowToFields(headers: readonly string[], row: readonly string[], mapping: ColumnMapping, dateOrder: DateOrder): RowResult {
  const cell = (field: ImportField) => {
    const header = mapping[field]
    const index = header === undefined ? -1 : headers.indexOf(header)
    // A quoted cell may hold line breaks (an address on two lines): they become ", " in a one-line field.
    return index < 0 ? '' : (row[index] ?? '').replace(/\s*[\r\n]+\s*/g, ', ').trim()
  }
  const errors: string[] = []
  const rawDate = cell('dateOfBirth')
  const dateOfBirth = rawDate === '' ? '' : parseDateInput(rawDate, dateOrder)
  if (dateOfBirth === null) errors.push(`${IMPORT_FIELD_LABELS.dateOfBirth}: "${rawDate}" is not a date in the form 1984-07-09 or ${formatLocalDate('1984-07-09', { dateOrder }, 'numeric')}`)
  const yesNo = (field: 'emailConsent' | 'smsConsent') => {
    const value = cell(field).toLowerCase()
    if (YES.has(value)) return true
    if (!NO.has(value)) errors.push(`${IMPORT_FIELD_LABELS[field]}: "${cell(field)}" should be yes or no`)
    return false
  }
  const candidate = {
    firstName: cell('firstName'), lastName: cell('lastName'), preferredName: cell('preferredName'), dateOfBirth: dateOfBirth ?? rawDate,
    email: cell('email'), phone: cell('phone'), addressStreet: cell('addressStreet'), addressCity: cell('addressCity'),
    addressRegion: cell('addressRegion'), addressPostalCode: cell('addressPostalCode'), emailConsent: yesNo('emailConsent'),
    emailConsentSource: 'import', smsConsent: yesNo('smsConsent'), smsConsentSource: 'import', guardianName: cell('guardianName'),
    guardianEmail: cell('guardianEmail'), guardianPhone: cell('guardianPhone'), frontDeskNote: cell('frontDeskNote'), alertText: cell('alertText'),
  }
  const parsed = PatientFieldsSchema.safeParse(candidate)
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const field = String(issue.path[0]) as ImportField
      if (field === 'dateOfBirth' && dateOfBirth === null) continue
      const label = IMPORT_FIELD_LABELS[field] ?? field
      const shown = field in candidate ? (candidate as Record<string, unknown>)[field] : ''
      errors.push(`${label}: ${shown === '' || typeof shown !== 'string' ? '' : `"${shown}" `}${issue.message}`)
    }
  }
  if (parsed.success && parsed.data.emailConsent && !parsed.data.email && !parsed.data.guardianEmail) errors.push(`${IMPORT_FIELD_LABELS.emailConsent}: yes, but there is no e-mail address`)
  if (parsed.success && parsed.data.smsConsent && !parsed.data.phone && !parsed.data.guardianPhone) errors.push(`${IMPORT_FIELD_LABELS.smsConsent}: yes, but there is no phone`)
  if (errors.length || !parsed.success) return { ok: false, errors: errors.length ? errors : ['the row could not be read'] }
  return { ok: true, fields: { ...parsed.data, emailConsentSource: parsed.data.emailConsent ? 'import' : null, smsConsentSource: parsed.data.smsConsent ? 'import' : null } }
}
