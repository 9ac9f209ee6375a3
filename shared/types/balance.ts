// What the Balance screen shows: per site, its chairs together, each chair and each provider.
import type { BalanceThresholds, DayUse, UseFigures } from '../domain/balance'
import type { OutcomeRates } from '../domain/visit-outcomes'

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
  /** How the site's visits in the range turned out: no-show and late-cancellation rates. */
  outcomes: OutcomeRates
}

export interface BalanceResponse {
  from: string
  to: string
  /** Hours before the start within which a cancellation counts as late (LATE_CANCEL_HOURS). */
  lateCancelHours: number
  thresholds: BalanceThresholds
  sites: SiteBalanceDto[]
}
