// Staff accounts and providers as the People screen and the API see them.
import type { SessionUser } from './auth'
import type { ROLE_GROUPS } from '../utils/access'

/** A staff account as the People screen lists it: the signed-in user's fields plus its state. */
export interface StaffAccount extends SessionUser {
  active: boolean
  lastSignInAt: string | null
  /** Set when this person is also a provider. */
  providerId: number | null
}

/** A provider's kind is the role of its account (users.role), never stored apart. */
export type ProviderKind = (typeof ROLE_GROUPS)['providers'][number]

export interface ProviderSummary {
  id: number
  userId: number
  name: string
  /** The account's role. */
  kind: ProviderKind
  colour: string
  /** Template categories this provider performs. */
  capabilities: string[]
  active: boolean
  /** Sites in the provider's own account scope (every site when the account is group-wide). */
  siteIds: number[]
}
