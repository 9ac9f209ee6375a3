// Who a patient message goes to (issue 16 §1): the patient, or a minor's guardian. 18 as the age of
// majority is common practice, no source (ADULT_FROM_YEARS, the practice decides).
import { describe, expect, it } from 'vitest'
import { isMinorOn, recipientOf, type RecipientPatient } from '../../../../shared/domain/message-recipient'

const CHILD: RecipientPatient = {
  firstName: 'Mia', lastName: 'Quill', dateOfBirth: '2015-06-10', email: 'mia@fernhollow.test', phone: '555-0110',
  guardianName: 'Rosa Quill', guardianEmail: 'rosa@fernhollow.test', guardianPhone: '555-0111',
}

describe('isMinorOn', () => {
  it('counts whole years on the given date, the 18th birthday itself being adult', () => {
    expect(isMinorOn('2008-06-10', '2026-06-09')).toBe(true)
    expect(isMinorOn('2008-06-10', '2026-06-10')).toBe(false)
    expect(isMinorOn('2008-02-29', '2026-02-28')).toBe(true)
    expect(isMinorOn('2008-02-29', '2026-03-01')).toBe(false)
  })
  it('treats an unknown birth date as adult', () => {
    expect(isMinorOn(null, '2026-06-10')).toBe(false)
  })
})

describe('recipientOf', () => {
  it('writes to the guardian of a minor, greeting the guardian and naming the patient', () => {
    expect(recipientOf(CHILD, 'email', '2026-06-10')).toEqual({ to: 'rosa@fernhollow.test', name: 'Rosa Quill', greeting: 'Rosa Quill', onBehalfOf: 'Mia Quill' })
    expect(recipientOf(CHILD, 'sms', '2026-06-10')).toMatchObject({ to: '555-0111', onBehalfOf: 'Mia Quill' })
  })
  it('skips a minor without the guardian contact for that channel, never falling back to the child', () => {
    expect(recipientOf({ ...CHILD, guardianEmail: null }, 'email', '2026-06-10')).toEqual({ skip: 'the patient is under 18 and no guardian e-mail address is on file: not sent to the child' })
    expect(recipientOf({ ...CHILD, guardianPhone: ' ' }, 'sms', '2026-06-10')).toEqual({ skip: 'the patient is under 18 and no guardian mobile number is on file: not sent to the child' })
  })
  it('greets an unnamed guardian as the parent or guardian', () => {
    expect(recipientOf({ ...CHILD, guardianName: null }, 'email', '2026-06-10')).toMatchObject({ greeting: 'parent or guardian of Mia' })
  })
  it('writes to an adult directly', () => {
    expect(recipientOf(CHILD, 'email', '2033-06-10')).toEqual({ to: 'mia@fernhollow.test', name: 'Mia Quill', greeting: 'Mia', onBehalfOf: null })
    expect(recipientOf({ ...CHILD, email: null }, 'email', '2033-06-10')).toEqual({ skip: 'the patient has no e-mail address' })
  })
})
