// Staff accounts and providers as the People screen and the API see them.
import type { SessionUser } from './auth'

/** A staff account as the People screen lists it: the signed-in user's fields plus its state. */
export interface StaffAccount extends SessionUser {
  active: boolean
  lastSignInAt: string | null
  /** Set when this person is also a provider. */
  providerId: number | null
}

export type ProviderKind = 'dentist' | 'hygienist'

export interface ProviderSummary {
  id: number
  userId: number
  name: string
  kind: ProviderKind
  colour: string
  /** Template categories this provider performs. */
  capabilities: string[]
  active: boolean
  /** Sites in the provider's own account scope (every site when the account is group-wide). */
  siteIds: number[]
}
