import { describe, expect, it } from 'vitest'
import { canOpenPath, homePathFor, navItemsFor } from '../../../../shared/utils/access'

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
