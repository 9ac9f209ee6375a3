// One place that decides who may call what: every route starts with requireUser or requireRole.
import type { H3Event } from 'h3'
import type { Role, SessionUser } from '#shared/types/auth'
import { ROLE_GROUPS } from '#shared/utils/access'
import { MESSAGES } from './errors'

/** The signed-in user, refreshed from the database by the session guard middleware. */
export function requireUser(event: H3Event): SessionUser {
  const user = event.context.currentUser as SessionUser | undefined
  if (!user) throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: MESSAGES.signedOut })
  return user
}

export function requireRole(event: H3Event, roles: readonly Role[]): SessionUser {
  const user = requireUser(event)
  if (!roles.includes(user.role)) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: MESSAGES.forbidden })
  }
  return user
}

export function canAccessSite(user: SessionUser, siteId: number): boolean {
  return user.allSites || user.siteIds.includes(siteId)
}

export function requireSiteAccess(user: SessionUser, siteId: number): void {
  if (!canAccessSite(user, siteId)) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: MESSAGES.forbiddenSite })
  }
}

// The role groups are defined once, in shared/utils/access.ts (ROLE_GROUPS, which the screens read too).
export const STAFF_ROLES: readonly Role[] = ROLE_GROUPS.staff
export const MANAGING_ROLES: readonly Role[] = ROLE_GROUPS.managing
export const BOOKING_ROLES: readonly Role[] = ROLE_GROUPS.booking
