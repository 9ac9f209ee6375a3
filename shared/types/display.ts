// How a site shows times and dates (issue 14): its clock and the order of a numeric date.
export const CLOCK_STYLES = ['12h', '24h'] as const
export type ClockStyle = (typeof CLOCK_STYLES)[number]

export const DATE_ORDERS = ['month-day-year', 'day-month-year', 'year-month-day'] as const
export type DateOrder = (typeof DATE_ORDERS)[number]

/** Everything the shared formatter needs to show an instant the way a site does. */
export interface DisplayStyle {
  timeZone: string
  clock: ClockStyle
  dateOrder: DateOrder
}

/** The site as a patient's own page (offer, move offer, recall page; no sign-in) names it and shows its times. */
export interface PublicSiteFacts extends DisplayStyle {
  siteName: string
  sitePhone: string | null
  siteAddress: string | null
}
