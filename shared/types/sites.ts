// Sites, rooms and their capabilities as the API returns them.
// Operatory capabilities (OPERATORY_CAPABILITIES) live with the chair-time types that need them.
export interface OperatorySummary {
  id: number
  siteId: number
  name: string
  capabilities: string[]
  active: boolean
  sortOrder: number
}
