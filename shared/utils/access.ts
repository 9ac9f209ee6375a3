// Which roles may open which screen. The navigation and the route middleware both read this,
// so a role never sees a link to a page it cannot use. The server checks again on every API call.
import type { Role } from '../types/auth'

export interface NavItem {
  path: string
  label: string
  roles: readonly Role[]
}

const EVERYONE: readonly Role[] = ['admin', 'manager', 'front_desk', 'dentist', 'hygienist', 'assistant']

export const NAV_ITEMS: readonly NavItem[] = [
  { path: '/chairboard', label: 'Chairboard', roles: EVERYONE },
  { path: '/my-day', label: 'My day', roles: ['dentist', 'hygienist'] },
  { path: '/week', label: 'Week', roles: EVERYONE },
  { path: '/templates', label: 'Templates', roles: EVERYONE },
  { path: '/rota', label: 'Rota', roles: EVERYONE },
  { path: '/balance', label: 'Balance', roles: ['admin', 'manager'] },
  { path: '/patients', label: 'Patients', roles: ['admin', 'manager', 'front_desk', 'dentist', 'hygienist', 'assistant'] },
  { path: '/people', label: 'People', roles: ['admin', 'manager'] },
  { path: '/sites', label: 'Sites & rooms', roles: ['admin', 'manager'] },
  { path: '/outbox', label: 'Outbox', roles: ['admin', 'manager', 'front_desk'] },
]

export function navItemsFor(role: Role): NavItem[] {
  return NAV_ITEMS.filter((item) => item.roles.includes(role))
}

/** The first screen after sign-in: providers start on their own day, everyone else on the board. */
export function homePathFor(role: Role): string {
  return role === 'dentist' || role === 'hygienist' ? '/my-day' : '/chairboard'
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
  return user.role === 'admin' || (user.role === 'manager' && user.allSites)
}

/** Admins and managers who cover at least one of the provider's sites look after that provider's rota. */
export function managesProvider(user: ScopedUser, providerSiteIds: readonly number[]): boolean {
  if (user.role !== 'admin' && user.role !== 'manager') return false
  return user.allSites || providerSiteIds.some((siteId) => user.siteIds.includes(siteId))
}

/** What everyone else reads instead of a time-off reason (it may be medical). */
export const TIME_OFF_SHOWN_AS = 'away'
