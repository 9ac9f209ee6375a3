// Openings grouped by gap (issue 14): pure, fixed instants are fine here.
import { describe, expect, it } from 'vitest'
import { groupOpenings } from '../../../../shared/domain/openings-groups'

const at = (operatoryId: number, providerId: number, start: string, minutes = 30) => ({
  siteId: 1, operatoryId, providerId,
  startUtc: `2026-03-10T${start}:00.000Z`,
  endUtc: new Date(Date.parse(`2026-03-10T${start}:00.000Z`) + minutes * 60_000).toISOString(),
})

describe('groupOpenings', () => {
  it('folds 5-minute variants of one free window into one gap with its earliest start first', () => {
    const gaps = groupOpenings([at(1, 1, '09:00'), at(1, 1, '09:05'), at(1, 1, '09:10'), at(2, 1, '09:00'), at(1, 1, '09:15')])
    expect(gaps).toHaveLength(2)
    expect(gaps[0]!.starts.map((opening) => opening.startUtc.slice(11, 16))).toEqual(['09:00', '09:05', '09:10', '09:15'])
    expect(gaps[0]!.toUtc).toBe('2026-03-10T09:45:00.000Z')
    expect(gaps[1]!.starts).toHaveLength(1)
  })

  it('keeps separate windows of the same chair and provider apart, and orders gaps by earliest start', () => {
    const gaps = groupOpenings([at(1, 1, '14:00'), at(1, 1, '09:00'), at(1, 2, '11:00')])
    expect(gaps.map((gap) => gap.fromUtc.slice(11, 16))).toEqual(['09:00', '11:00', '14:00'])
  })

  it('treats another provider in the same chair as another gap', () => {
    expect(groupOpenings([at(1, 1, '09:00'), at(1, 2, '09:00')])).toHaveLength(2)
  })
})
