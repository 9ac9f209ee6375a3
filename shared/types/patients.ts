// Patient records as the API returns them (issue 16).
import type { DuplicateReason } from '../domain/patient-duplicates'
import type { ConsentSource } from '../schemas/patients'
import type { PatientDto } from './visits'

/** The whole record: GET/PATCH /api/patients/:id. `firstName` is the given name, `lastName` the family name. */
export interface PatientRecordDto extends PatientDto {
  preferredName: string | null
  addressStreet: string | null
  addressCity: string | null
  addressRegion: string | null
  addressPostalCode: string | null
  emailConsentAt: string | null
  emailConsentSource: ConsentSource | null
  smsConsent: boolean
  smsConsentAt: string | null
  smsConsentSource: ConsentSource | null
  guardianName: string | null
  guardianEmail: string | null
  guardianPhone: string | null
  frontDeskNote: string | null
  alertText: string | null
  rowVersion: number
}

/** A likely duplicate, with why. */
export interface DuplicateCandidateDto {
  patient: PatientDto
  reasons: DuplicateReason[]
}

/** What a merged-away record's id answers (GET /api/patients/:id). */
export interface MergedPatientAnswer {
  mergedInto: number
}

export interface PatientMergeResult {
  survivor: PatientRecordDto
  movedVisitIds: number[]
  mergeId: number
}
