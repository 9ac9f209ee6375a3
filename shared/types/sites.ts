import type { SiteSummary } from './auth'
import type { OpeningHours } from './rota'

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

/** A site with everything the Sites & rooms screen edits (SiteSummary plus contact and calendar). */
export interface SiteDetail extends SiteSummary {
  address: string
  phone: string
  email: string
  openingHours: OpeningHours
  closedDates: string[]
  active: boolean
}
