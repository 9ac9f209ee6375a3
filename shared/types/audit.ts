// The Audit screen's rows (issue 16 §4).
export interface AuditEntryDto {
  id: number
  atUtc: string
  userId: number | null
  userName: string | null
  action: string
  entity: string
  entityId: string | null
  ip: string | null
  before: unknown
  after: unknown
}

export interface AuditPage {
  entries: AuditEntryDto[]
  total: number
  page: number
  pageSize: number
}
