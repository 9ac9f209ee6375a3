import { describe, expect, it } from 'vitest'
import { planVisit } from '../../../../shared/domain/chair-time'
import { minimumChairMinutes, withChairMinutes } from '../../../../shared/domain/length-override'
import { DomainValidationError } from '../../../../shared/domain/errors'
import { DEFAULT_TEMPLATES } from '../../../../seeds/data/procedure-templates'

const composite = DEFAULT_TEMPLATES.find((template) => template.code === 'COMP-POST')!
const plan = planVisit([{ template: composite, tooth: '19', surfaces: 'MO' }], { unitMinutes: 5 })

describe('changing a visit length by hand', () => {
  it('grows only the room reset at the end and records the reason', () => {
    const longer = withChairMinutes(plan, plan.chairMinutes + 15, 'anxious patient')
    expect(longer.chairMinutes).toBe(plan.chairMinutes + 15)
    expect(longer.segments.at(-1)).toMatchObject({ kind: 'reset', endMinute: plan.chairMinutes + 15 })
    expect(longer.segments.filter((segment) => segment.kind === 'hands_on')).toEqual(plan.segments.filter((segment) => segment.kind === 'hands_on'))
    expect(longer.lengthOverride).toEqual({ chairMinutes: plan.chairMinutes + 15, reason: 'anxious patient' })
  })

  it('can drop the reset but never cut into the work', () => {
    const floor = minimumChairMinutes(plan)
    const shortest = Math.ceil(floor / 5) * 5
    expect(withChairMinutes(plan, shortest, 'quick turnover').chairMinutes).toBe(shortest)
    expect(() => withChairMinutes(plan, floor - 5 - (floor % 5), 'too short')).toThrow(DomainValidationError)
  })

  it('keeps the booking unit', () => {
    expect(() => withChairMinutes(plan, plan.chairMinutes + 3, 'odd')).toThrow(/5-minute unit/)
  })

  it('keeps segments contiguous from 0 to the new length', () => {
    const changed = withChairMinutes(plan, plan.chairMinutes + 10, 'x')
    changed.segments.forEach((segment, index) => {
      expect(segment.startMinute).toBe(index === 0 ? 0 : changed.segments[index - 1]!.endMinute)
    })
    expect(changed.segments.at(-1)!.endMinute).toBe(changed.chairMinutes)
  })
})
