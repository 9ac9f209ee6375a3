// What the Balance screen shows: per site, its chairs together, each chair and each provider.
import type { BalanceThresholds, DayUse, UseFigures } from '../domain/balance'

export interface NamedUse extends UseFigures {
  id: number
  name: string
}

export interface SiteBalanceDto {
  siteId: number
  siteName: string
  timeZone: string
  chairs: UseFigures
  /** All chairs together per local date of the range. */
  days: DayUse[]
  operatories: NamedUse[]
  providers: NamedUse[]
}

export interface BalanceResponse {
  from: string
  to: string
  thresholds: BalanceThresholds
  sites: SiteBalanceDto[]
}
