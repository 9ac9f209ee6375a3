// Consent follows the contact (issue 16 §2, merge). A patient agreed to e-mail at certain addresses
// and to texts at certain numbers; a merge that keeps the e-mail of one record must not keep the
// e-mail consent of the other when that consent was given for a different address. For each channel the
// merged record keeps the consent (yes or no, with its date and source) of the record whose consent
// covers every contact kept for that channel (the patient's own and the guardian's): the record the
// user chose when it covers them, else the other one, else none (no consent: ask the patient again).
// Pure: the server applies it, the merge panel shows it before the user merges.
import type { MergeField } from '../schemas/patients'

export type MergeSide = 'survivor' | 'merged'

export interface ConsentRecord {
  email: string | null
  guardianEmail: string | null
  phone: string | null
  guardianPhone: string | null
  emailConsent: boolean
  smsConsent: boolean
}

export interface ChannelConsent {
  /** The record whose consent the merged record keeps, or 'none' (consent not given for what is kept). */
  from: MergeSide | 'none'
  consent: boolean
  /** Words for the merge panel when the result is not what the user chose, else null. */
  note: string | null
}

const CHANNELS = {
  email: { contacts: ['email', 'guardianEmail'], consent: 'emailConsent', word: 'E-mail consent', what: 'e-mail address' },
  sms: { contacts: ['phone', 'guardianPhone'], consent: 'smsConsent', word: 'Text consent', what: 'number' },
} as const

function normalised(field: string, value: string | null): string | null {
  const text = value?.trim()
  if (!text) return null
  return field.toLowerCase().includes('phone') ? text.replace(/[^\d+]/g, '') : text.toLowerCase()
}

function contactsOf(record: ConsentRecord, fields: readonly ('email' | 'guardianEmail' | 'phone' | 'guardianPhone')[]): Set<string> {
  return new Set(fields.map((field) => normalised(field, record[field])).filter((value): value is string => value !== null))
}

/** The consent the merged record keeps on one channel, given which record each field is taken from. */
export function mergedConsent(channel: 'email' | 'sms', survivor: ConsentRecord, merged: ConsentRecord, take: Partial<Record<MergeField, MergeSide>>): ChannelConsent {
  const { contacts, consent, word, what } = CHANNELS[channel]
  const side = (field: MergeField): MergeSide => take[field] ?? 'survivor'
  const recordOf = (from: MergeSide) => (from === 'survivor' ? survivor : merged)
  const kept = contacts.map((field) => normalised(field, recordOf(side(field))[field])).filter((value): value is string => value !== null)
  // Consent goes with the patient's own contact by default; an explicit choice is kept when it covers.
  const chosen = take[consent] ?? side(contacts[0])
  const covers = (from: MergeSide) => kept.length > 0 && kept.every((contact) => contactsOf(recordOf(from), contacts).has(contact))
  const other: MergeSide = chosen === 'survivor' ? 'merged' : 'survivor'
  const from: MergeSide | 'none' = covers(chosen) ? chosen : covers(other) ? other : 'none'
  const result = from === 'none' ? false : recordOf(from)[consent]
  let note: string | null = null
  if (from === 'none' && recordOf(chosen)[consent]) {
    note = kept.length === 0 ? `No ${what} is kept, so the merged record has no ${word.toLowerCase()}.` : `${word} was given for another ${what} than the one kept: the merged record has no ${word.toLowerCase()} until the patient gives it again.`
  } else if (from !== 'none' && from !== chosen && recordOf(chosen)[consent] !== result) {
    note = `${word} follows the ${what} kept: ${result ? 'yes' : 'no'}, as given with it.`
  }
  return { from, consent: result, note }
}
