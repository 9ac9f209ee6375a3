import { describe, expect, it } from 'vitest'
import { canEditGroupWide, canOpenPath, homePathFor, managesProvider, navItemsFor } from '../../../../shared/utils/access'

describe('page access by role', () => {
  it('starts providers on their own day and everyone else on the Chairboard', () => {
    expect(homePathFor('dentist')).toBe('/my-day')
    expect(homePathFor('hygienist')).toBe('/my-day')
    expect(homePathFor('front_desk')).toBe('/chairboard')
    expect(homePathFor('admin')).toBe('/chairboard')
  })

  it('keeps front desk out of the manager screens', () => {
    const labels = navItemsFor('front_desk').map((item) => item.label)
    expect(labels).toContain('Chairboard')
    expect(labels).not.toContain('Balance')
    expect(labels).not.toContain('People')
    expect(canOpenPath('front_desk', '/balance')).toBe(false)
    expect(canOpenPath('manager', '/balance')).toBe(true)
  })

  it('gives My day only to providers', () => {
    expect(canOpenPath('dentist', '/my-day')).toBe(true)
    expect(canOpenPath('front_desk', '/my-day')).toBe(false)
  })

  it('gives everyone the week views, including their sub-pages', () => {
    for (const role of ['admin', 'manager', 'front_desk', 'dentist', 'hygienist', 'assistant'] as const) {
      expect(navItemsFor(role).map((item) => item.label)).toContain('Week')
      expect(canOpenPath(role, '/week/operatory')).toBe(true)
    }
  })
})

describe('group-wide and provider scopes (issue 11 §6)', () => {
  const quarryManager = { role: 'manager' as const, allSites: false, siteIds: [1] }
  it('only admins and managers of all sites edit group-wide templates', () => {
    expect(canEditGroupWide({ role: 'admin', allSites: false, siteIds: [1] })).toBe(true)
    expect(canEditGroupWide({ role: 'manager', allSites: true, siteIds: [] })).toBe(true)
    expect(canEditGroupWide(quarryManager)).toBe(false)
    expect(canEditGroupWide({ role: 'front_desk', allSites: true, siteIds: [] })).toBe(false)
  })
  it('a manager looks after providers working at one of their sites, never others; other roles never', () => {
    expect(managesProvider(quarryManager, [1, 2])).toBe(true)
    expect(managesProvider(quarryManager, [2])).toBe(false)
    expect(managesProvider(quarryManager, [])).toBe(false)
    expect(managesProvider({ role: 'manager', allSites: true, siteIds: [] }, [2])).toBe(true)
    expect(managesProvider({ role: 'front_desk', allSites: false, siteIds: [1] }, [1])).toBe(false)
    expect(managesProvider({ role: 'dentist', allSites: false, siteIds: [1] }, [1])).toBe(false)
  })
})
