// Which roles may open which screen. The navigation and the route middleware both read this,
// so a role never sees a link to a page it cannot use. The server checks again on every API call.
import type { Role } from '../types/auth'

export interface NavItem {
  path: string
  label: string
  roles: readonly Role[]
}

/**
 * Role groups: the one definition. The server's requireRole calls read them (server/utils/auth.ts gives
 * the handlers their short names STAFF_ROLES, MANAGING_ROLES, BOOKING_ROLES) and the screens read them.
 */
export const ROLE_GROUPS = {
  /** Every staff role. */
  staff: ['admin', 'manager', 'front_desk', 'dentist', 'hygienist', 'assistant'],
  /** Those who keep rotas, rooms, settings and read the balance. */
  managing: ['admin', 'manager'],
  /** Those who book, move and cancel visits. */
  booking: ['admin', 'manager', 'front_desk'],
  /** Dentists and hygienists: the roles with a provider record and a day of their own. */
  providers: ['dentist', 'hygienist'],
} as const satisfies Record<string, readonly Role[]>

const STAFF_ROLES: readonly Role[] = ROLE_GROUPS.staff
const MANAGING_ROLES: readonly Role[] = ROLE_GROUPS.managing
const BOOKING_ROLES: readonly Role[] = ROLE_GROUPS.booking
const PROVIDER_ROLES: readonly Role[] = ROLE_GROUPS.providers

export function isProviderRole(role: Role): role is 'dentist' | 'hygienist' {
  return PROVIDER_ROLES.includes(role)
}

/** Whether a (possibly signed-out) user's role is in a group. */
export function hasRole(user: { role: Role } | null | undefined, group: readonly Role[]): boolean {
  return user !== null && user !== undefined && group.includes(user.role)
}

const EVERYONE = STAFF_ROLES

export const NAV_ITEMS: readonly NavItem[] = [
  { path: '/chairboard', label: 'Chairboard', roles: EVERYONE },
  { path: '/my-day', label: 'My day', roles: PROVIDER_ROLES },
  { path: '/week', label: 'Week', roles: EVERYONE },
  { path: '/templates', label: 'Templates', roles: EVERYONE },
  { path: '/rota', label: 'Rota', roles: EVERYONE },
  { path: '/balance', label: 'Balance', roles: MANAGING_ROLES },
  { path: '/patients', label: 'Patients', roles: STAFF_ROLES },
  { path: '/people', label: 'People', roles: MANAGING_ROLES },
  { path: '/sites', label: 'Sites & rooms', roles: MANAGING_ROLES },
  { path: '/outbox', label: 'Outbox', roles: BOOKING_ROLES },
  { path: '/rebook', label: 'Rebook list', roles: BOOKING_ROLES },
  { path: '/waitlist', label: 'Waitlist', roles: BOOKING_ROLES },
  { path: '/recall', label: 'Recall', roles: BOOKING_ROLES },
  { path: '/audit', label: 'Audit', roles: MANAGING_ROLES },
]

export function navItemsFor(role: Role): NavItem[] {
  return NAV_ITEMS.filter((item) => item.roles.includes(role))
}

/** The first screen after sign-in: providers start on their own day, everyone else on the board. */
export function homePathFor(role: Role): string {
  return PROVIDER_ROLES.includes(role) ? '/my-day' : '/chairboard'
}

export function canOpenPath(role: Role, path: string): boolean {
  const item = NAV_ITEMS.find((nav) => path === nav.path || path.startsWith(`${nav.path}/`))
  return item ? item.roles.includes(role) : true
}

/** The parts of a signed-in user the scope rules below read. */
export interface ScopedUser {
  role: Role
  allSites: boolean
  siteIds: readonly number[]
}

/**
 * Group-wide things (chair-time templates) are kept by admins and by managers of every site; a
 * manager scoped to some sites would otherwise change what every other site books with.
 */
export function canEditGroupWide(user: ScopedUser): boolean {
  return user.role === 'admin' || (MANAGING_ROLES.includes(user.role) && user.allSites)
}

/** Admins and managers who cover at least one of the provider's sites look after that provider's rota. */
export function managesProvider(user: ScopedUser, providerSiteIds: readonly number[]): boolean {
  if (!MANAGING_ROLES.includes(user.role)) return false
  return user.allSites || providerSiteIds.some((siteId) => user.siteIds.includes(siteId))
}

/** What everyone else reads instead of a time-off reason (it may be medical). */
export const TIME_OFF_SHOWN_AS = 'away'
