// Stranded visits (glossary: Rebook list, "needs a new time"): what a change would strand, and the
// site's list of visits waiting for a new time.

/** One visit a change would strand (or did): the answer of a `dryRun` and of the save. */
export interface StrandedVisitDto {
  id: number
  /** The patient's name. */
  patient: string
  /** Its start on the site's clock, ISO 8601 with the site's offset. */
  startLocalIso: string
  siteId: number
  /** Why it no longer holds, in plain words ("Dr Vale is away"). */
  reason: string
}

/** What a change route answers to `dryRun: true`: nothing is written. */
export interface StrandedPreview {
  strandedVisits: StrandedVisitDto[]
}

/** A procedure of a stranded visit as POST /api/openings takes it (tooth in Universal numbering). */
export interface RebookItem {
  templateCode: string
  tooth?: string
  teeth?: string[]
  surfaces?: string
  notation?: 'universal'
}

/** One row of the Rebook list. */
export interface RebookEntry {
  id: number
  siteId: number
  operatoryId: number
  providerId: number
  patientId: number
  patient: string
  phone: string | null
  email: string | null
  startUtc: string
  endUtc: string
  startLocalIso: string
  timeZone: string
  reason: string
  strandedAt: string
  rowVersion: number
  providerName: string
  operatoryName: string
  procedures: string[]
  items: RebookItem[]
}

export interface RebookList {
  siteId: number
  count: number
  visits: RebookEntry[]
}
