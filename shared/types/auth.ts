// Who is signed in, as both the server and the client see it.
import type { ToothNotation } from './teeth'
import type { ClockStyle, DateOrder } from './display'

export const ROLES = ['admin', 'manager', 'front_desk', 'dentist', 'hygienist', 'assistant'] as const
export type Role = (typeof ROLES)[number]

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  manager: 'Manager',
  front_desk: 'Front desk',
  dentist: 'Dentist',
  hygienist: 'Hygienist',
  assistant: 'Assistant',
}

export interface SessionUser {
  id: number
  email: string
  name: string
  role: Role
  /** Admins and managers may be scoped to every site, including sites added later. */
  allSites: boolean
  siteIds: number[]
}

export interface SiteSummary {
  id: number
  name: string
  slug: string
  timeZone: string
  colour: string
  bookingUnitMinutes: number
  toothNotation: ToothNotation
  /** A booked visit not arrived this many minutes after its start is late (issue 13 §3; shared/domain/late.ts). */
  lateAfterMinutes: number
  /** How this site shows times: '12h' (9:05 AM) or '24h' (09:05). */
  clock: ClockStyle
  /** Order of a numeric date: month-day-year (09/13/1973), day-month-year, year-month-day (1973-09-13). */
  dateOrder: DateOrder
}

export interface MeResponse {
  user: SessionUser
  sites: SiteSummary[]
}
