// Reading a failed $fetch: ofetch puts the API's error answer (ApiErrorBody) in `data`.
// A 400 names a field for programs (`operatoryId`, `items.0.tooth`); people read `plainReason`'s words.
import type { ApiErrorBody, FieldProblem } from '../types/api-errors'

export function apiErrorBody(caught: unknown): ApiErrorBody | undefined {
  return (caught as { data?: ApiErrorBody } | null | undefined)?.data
}

/** The words a person reads for each field name the API uses (never the name itself). */
const FIELD_WORDS: Record<string, string> = {
  operatoryId: 'chair',
  providerId: 'provider',
  patientId: 'patient',
  siteId: 'site',
  siteIds: 'sites',
  startUtc: 'start time',
  endUtc: 'end time',
  from: 'first day',
  to: 'last day',
  items: 'procedures',
  templateCode: 'procedure',
  tooth: 'tooth',
  surfaces: 'surfaces',
  note: 'note',
  reason: 'reason',
  rowVersion: 'visit',
  dateOfBirth: 'date of birth',
  email: 'e-mail address',
  phone: 'phone number',
  firstName: 'first name',
  lastName: 'last name',
  chairMinutes: 'length',
}
/** Fields a person chooses from a list: "is required" there reads "Choose a provider". */
const CHOSEN = new Set(['operatoryId', 'providerId', 'patientId', 'siteId', 'siteIds', 'templateCode'])
/** What zod and our schemas say when a value is missing or not a number at all. */
const MISSING = /^(is required|required|must be a number|must be a whole number.*|invalid input.*|expected .*received (undefined|null).*)$/i

function fieldWords(field: string): string {
  const known = FIELD_WORDS[field]
  if (known) return known
  // camelCase to words, without the Id/Utc endings programs use.
  return field.replace(/(Id|Ids|Utc|Ms)$/, '').replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase()
}
const sentence = (text: string) => {
  const trimmed = text.trim()
  const capital = `${trimmed.charAt(0).toUpperCase()}${trimmed.slice(1)}`
  return /[.!?]$/.test(capital) ? capital : `${capital}.`
}

/**
 * A 400's field and reason as one plain sentence: a reason that is already a sentence ("Hygiene A is
 * not equipped for restorative") stands alone; a missing choice reads "Choose a provider."; a
 * procedure's field names the procedure ("Procedure 2: tooth is required."); anything else puts the
 * field's words before the reason ("Start time must be at least 60 minutes from now.").
 */
export function plainReason(field: string, reason: string): string {
  const item = /^items\.(\d+)\.(\w+)/.exec(field)
  const prefix = item ? `Procedure ${Number(item[1]) + 1}: ` : ''
  const name = item ? item[2]! : field.split('.').at(-1) ?? field
  const words = fieldWords(name)
  if (MISSING.test(reason.trim()) && (CHOSEN.has(name) || /Id$/.test(name))) return `${prefix}${sentence(`choose a ${words}`)}`
  if (MISSING.test(reason.trim())) return `${prefix}${sentence(`${words} is required`)}`
  if (/^[A-Z0-9]/.test(reason.trim())) return `${prefix}${sentence(reason)}`
  if (/^(is|are|must|cannot|can|does|has|should|needs|was|will)\b/.test(reason.trim())) return `${prefix}${sentence(`${words} ${reason.trim()}`)}`
  return `${prefix}${sentence(`${words}: ${reason.trim()}`)}`
}

/** The answer's message in plain words, or `fallback` when there is none (network failure, no body). */
export function apiErrorMessage(caught: unknown, fallback: string): string {
  const body = apiErrorBody(caught)
  const field = body?.data?.field
  const reason = body?.data?.reason
  if (body?.statusCode === 400 && typeof field === 'string' && typeof reason === 'string') return plainReason(field, reason)
  return body?.message ?? fallback
}

/** The fields a 400 named; empty for any other failure. */
export function apiErrorIssues(caught: unknown): FieldProblem[] {
  return apiErrorBody(caught)?.data?.issues ?? []
}

export function apiErrorStatus(caught: unknown): number | undefined {
  return (caught as { statusCode?: number } | null | undefined)?.statusCode
}
