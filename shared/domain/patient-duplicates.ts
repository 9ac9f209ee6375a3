// Likely duplicate patients (issue 16 §2): the same e-mail (case and spaces ignored), the same phone
// in E.164, or the same date of birth with a similar name. Names are compared folded: case, accents,
// spaces, hyphens and apostrophes ignored, and one character added, dropped, changed or two swapped
// still counts as the same name. Pure: the caller brings the candidates.

export interface PatientIdentity {
  firstName: string
  lastName: string
  dateOfBirth: string
  email: string | null
  /** E.164 */
  phone: string | null
}

export type DuplicateReason = 'email' | 'phone' | 'name_and_birth_date'

export const DUPLICATE_REASON_LABELS: Record<DuplicateReason, string> = {
  email: 'same e-mail',
  phone: 'same phone',
  name_and_birth_date: 'same birth date and a similar name',
}

export interface DuplicateMatch<T> {
  candidate: T
  reasons: DuplicateReason[]
}

export function normaliseEmail(email: string | null | undefined): string | null {
  const folded = (email ?? '').trim().toLowerCase()
  return folded === '' ? null : folded
}

/** "  José-María O'Neil " → "josemariaoneil". */
export function foldName(name: string): string {
  return name.normalize('NFKD').replace(/\p{M}/gu, '').toLowerCase().replace(/[^\p{L}\p{N}]/gu, '')
}

/** Whether two strings differ by at most one insertion, deletion, substitution or swap of neighbours. */
export function withinOneEdit(a: string, b: string): boolean {
  if (a === b) return true
  if (Math.abs(a.length - b.length) > 1) return false
  if (a.length === b.length) {
    const differ: number[] = []
    for (let index = 0; index < a.length; index += 1) if (a[index] !== b[index]) differ.push(index)
    if (differ.length === 1) return true
    return differ.length === 2 && differ[1] === differ[0]! + 1 && a[differ[0]!] === b[differ[1]!] && a[differ[1]!] === b[differ[0]!]
  }
  const [short, long] = a.length < b.length ? [a, b] : [b, a]
  let index = 0
  while (index < short.length && short[index] === long[index]) index += 1
  return short.slice(index) === long.slice(index + 1)
}

/** Given and family names folded and compared as one, also with the two swapped. */
export function similarNames(a: Pick<PatientIdentity, 'firstName' | 'lastName'>, b: Pick<PatientIdentity, 'firstName' | 'lastName'>): boolean {
  const first = foldName(a.firstName) + '|' + foldName(a.lastName)
  return withinOneEdit(first, foldName(b.firstName) + '|' + foldName(b.lastName))
    || withinOneEdit(first, foldName(b.lastName) + '|' + foldName(b.firstName))
}

/** Why `candidate` may be the same person as `person`; empty when nothing matches. */
export function duplicateReasons(person: PatientIdentity, candidate: PatientIdentity): DuplicateReason[] {
  const reasons: DuplicateReason[] = []
  const email = normaliseEmail(person.email)
  if (email && email === normaliseEmail(candidate.email)) reasons.push('email')
  if (person.phone && person.phone === candidate.phone) reasons.push('phone')
  if (person.dateOfBirth === candidate.dateOfBirth && similarNames(person, candidate)) reasons.push('name_and_birth_date')
  return reasons
}

/** The candidates that are likely the same person, strongest first (most reasons). */
export function findDuplicates<T extends PatientIdentity>(person: PatientIdentity, candidates: readonly T[]): DuplicateMatch<T>[] {
  return candidates
    .map((candidate) => ({ candidate, reasons: duplicateReasons(person, candidate) }))
    .filter((match) => match.reasons.length > 0)
    .sort((a, b) => b.reasons.length - a.reasons.length)
}

/**
 * The same matching over many people (an imported file against the database): candidates filed by
 * e-mail, phone and birth date, so each person is compared only with those sharing one of them.
 */
export class DuplicateIndex<T extends PatientIdentity> {
  private readonly byKey = new Map<string, T[]>()

  constructor(candidates: Iterable<T> = []) {
    for (const candidate of candidates) this.add(candidate)
  }

  add(candidate: T): void {
    const email = normaliseEmail(candidate.email)
    for (const key of [email && `e:${email}`, candidate.phone && `p:${candidate.phone}`, `d:${candidate.dateOfBirth}`]) {
      if (!key) continue
      const list = this.byKey.get(key) ?? []
      list.push(candidate)
      this.byKey.set(key, list)
    }
  }

  match(person: PatientIdentity): DuplicateMatch<T>[] {
    const email = normaliseEmail(person.email)
    const near = new Set<T>()
    for (const key of [email && `e:${email}`, person.phone && `p:${person.phone}`, `d:${person.dateOfBirth}`]) {
      for (const candidate of (key && this.byKey.get(key)) || []) near.add(candidate)
    }
    return findDuplicates(person, [...near])
  }
}
