// The role groups in shared/utils/access.ts (ROLE_GROUPS) are the one definition both the server (requireRole) and
// the screens read; the navigation follows them.
import { describe, expect, it } from 'vitest'
import { ROLES } from '../../../../shared/types/auth'
import { canOpenPath, hasRole, isProviderRole, ROLE_GROUPS } from '../../../../shared/utils/access'
import type { Role } from '../../../../shared/types/auth'

const { staff: STAFF_ROLES, managing: MANAGING_ROLES, booking: BOOKING_ROLES, providers: PROVIDER_ROLES } = ROLE_GROUPS
const within = (group: readonly Role[], role: Role) => group.includes(role)

describe('role groups', () => {
  it('staff are every role; managing, booking and provider roles are subsets of it', () => {
    expect([...STAFF_ROLES].sort()).toEqual([...ROLES].sort())
    expect(MANAGING_ROLES).toEqual(['admin', 'manager'])
    expect(BOOKING_ROLES).toEqual(['admin', 'manager', 'front_desk'])
    expect(PROVIDER_ROLES).toEqual(['dentist', 'hygienist'])
  })
  it('hasRole answers false for a signed-out user and follows the group otherwise', () => {
    expect(hasRole(null, STAFF_ROLES)).toBe(false)
    expect(hasRole(undefined, STAFF_ROLES)).toBe(false)
    expect(hasRole({ role: 'front_desk' }, BOOKING_ROLES)).toBe(true)
    expect(hasRole({ role: 'front_desk' }, MANAGING_ROLES)).toBe(false)
  })
  it('isProviderRole picks dentists and hygienists', () => {
    expect(ROLES.filter(isProviderRole)).toEqual(['dentist', 'hygienist'])
  })
  it('the screens open to a group are the ones its roles can open', () => {
    for (const role of ROLES) {
      expect(canOpenPath(role, '/balance')).toBe(within(MANAGING_ROLES, role))
      expect(canOpenPath(role, '/outbox')).toBe(within(BOOKING_ROLES, role))
      expect(canOpenPath(role, '/my-day')).toBe(within(PROVIDER_ROLES, role))
    }
  })
})
