import { describe, expect, it } from 'vitest'
import { DomainValidationError } from '../../../../shared/domain/errors'

describe('DomainValidationError', () => {
  it('carries the field path and the reason the server turns into a 400', () => {
    const error = new DomainValidationError('items.1.surfaces', 'must name at least one surface')
    expect(error).toBeInstanceOf(Error)
    expect(error.name).toBe('DomainValidationError')
    expect(error.field).toBe('items.1.surfaces')
    expect(error.reason).toBe('must name at least one surface')
    expect(error.message).toBe('must name at least one surface')
  })
})
