// The patient's part of a visit (shared/domain/patient-time.ts): what e-mails, the calendar event and
// the visit page show, and whether a change is one the patient sees.
import { describe, expect, it } from 'vitest'
import { patientMinutesOf, seenChange, seenVisitOf } from '../../../../shared/domain/patient-time'

describe('the patient\'s time', () => {
  const segments = [
    { kind: 'hands_on', startMinute: 0, endMinute: 40 },
    { kind: 'reset', startMinute: 40, endMinute: 55 },
  ] as never
  it('ends before the room reset after the patient leaves (common practice, no source)', () => {
    expect(patientMinutesOf({ segments }, 55)).toBe(40)
    expect(patientMinutesOf(undefined, 30)).toBe(30)
  })

  it('sees no change when only the chair time after the patient changed', () => {
    expect(seenChange({ startMs: 0, minutes: 40, what: [] }, { startMs: 0, minutes: 40, what: [] })).toBeNull()
    expect(seenChange({ startMs: 0, minutes: 40, what: [] }, { startMs: 0, minutes: 50, what: [] })).toEqual({ time: false, length: true, what: false })
    expect(seenChange({ startMs: 0, minutes: 40, what: [] }, { startMs: 1, minutes: 40, what: [] })).toEqual({ time: true, length: false, what: false })
    expect(seenChange({ startMs: 0, minutes: 40, what: ['Exam'] }, { startMs: 0, minutes: 40, what: ['Exam', 'Cleaning'] })).toEqual({ time: false, length: false, what: true })
  })

  it('is the whole chair time when nothing follows as reset, or when reset is all there is', () => {
    const noReset = [{ kind: 'hands_on', startMinute: 0, endMinute: 30 }] as never
    expect(patientMinutesOf({ segments: noReset }, 30)).toBe(30)
    const onlyReset = [{ kind: 'reset', startMinute: 0, endMinute: 10 }] as never
    expect(patientMinutesOf({ segments: onlyReset }, 10)).toBe(10)
  })

  it('shows procedure names only where the site allows it, once each', () => {
    const plan = { segments: [{ kind: 'hands_on', startMinute: 0, endMinute: 40 }, { kind: 'reset', startMinute: 40, endMinute: 50 }], items: [{ templateName: 'Filling' }, { templateName: 'Filling' }, { templateName: 'Exam' }] } as never
    expect(seenVisitOf(plan, 0, 50 * 60_000, true)).toEqual({ startMs: 0, minutes: 40, what: ['Filling', 'Exam'] })
    expect(seenVisitOf(plan, 0, 50 * 60_000, false)).toEqual({ startMs: 0, minutes: 40, what: [] })
  })
})
