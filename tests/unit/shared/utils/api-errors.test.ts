// Server reasons reach people in plain words, never field names (issue 14, "Messages and feedback").
import { describe, expect, it } from 'vitest'
import { apiErrorMessage, plainReason } from '../../../../shared/utils/api-errors'

describe('plainReason', () => {
  it('lets a reason that is already a sentence stand alone, without the field name', () => {
    expect(plainReason('operatoryId', 'Hygiene A is not equipped for restorative (Posterior composite)'))
      .toBe('Hygiene A is not equipped for restorative (Posterior composite).')
    expect(plainReason('providerId', 'Dr Ng does not do restorative procedures')).toBe('Dr Ng does not do restorative procedures.')
  })

  it('asks to choose when a chosen field is missing', () => {
    expect(plainReason('providerId', 'must be a number')).toBe('Choose a provider.')
    expect(plainReason('operatoryId', 'is required')).toBe('Choose a chair.')
    expect(plainReason('patientId', 'Invalid input: expected number, received null')).toBe('Choose a patient.')
  })

  it('puts plain field words before a fragment', () => {
    expect(plainReason('startUtc', "must be on the site's 5-minute grid")).toBe("Start time must be on the site's 5-minute grid.")
    expect(plainReason('items.1.tooth', 'is required')).toBe('Procedure 2: Tooth is required.')
    expect(plainReason('patientId', 'no such patient')).toBe('Patient: no such patient.')
  })

  it('never shows a camelCase field name', () => {
    expect(plainReason('preferredSiteId', 'is not a site')).toBe('Preferred site is not a site.')
  })
})

describe('apiErrorMessage', () => {
  it('reads a 400 in plain words and keeps other messages as they are', () => {
    const bad = { data: { statusCode: 400, message: 'providerId: must be a number', data: { field: 'providerId', reason: 'must be a number' } } }
    expect(apiErrorMessage(bad, 'x')).toBe('Choose a provider.')
    const clash = { data: { statusCode: 409, message: 'Room 2 is already taken 10:00–10:30.', data: { field: 'operatoryId' } } }
    expect(apiErrorMessage(clash, 'x')).toBe('Room 2 is already taken 10:00–10:30.')
    expect(apiErrorMessage(new Error('offline'), 'Could not book.')).toBe('Could not book.')
  })
})
