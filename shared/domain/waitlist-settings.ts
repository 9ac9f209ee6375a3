// A site's waitlist and recall settings (sites.settings JSON), with the group's defaults. Pure.

export interface WaitlistSettings {
  /** How long an offer stays open after it is sent (never past the slot's start minus the patient's notice). */
  offerHours: number
}

export const DEFAULT_OFFER_HOURS = 2

export function waitlistSettingsOf(settings: Record<string, unknown>): WaitlistSettings {
  const hours = settings.offerHours
  return { offerHours: typeof hours === 'number' && hours > 0 && hours <= 72 ? hours : DEFAULT_OFFER_HOURS }
}
