import { describe, expect, it } from 'vitest'
import { duplicateReasons, findDuplicates, foldName, normaliseEmail, similarNames, withinOneEdit, type PatientIdentity } from '../../../../shared/domain/patient-duplicates'

const ana: PatientIdentity = { firstName: 'Ana', lastName: 'Quintero', dateOfBirth: '1984-07-09', email: 'Ana.Quintero@Fernhollow.test', phone: '+12095550177' }
const other = (overrides: Partial<PatientIdentity>): PatientIdentity => ({ firstName: 'Bram', lastName: 'Oduya', dateOfBirth: '1970-01-02', email: null, phone: null, ...overrides })

describe('patient duplicates', () => {
  it('folds case, accents, spaces, hyphens and apostrophes', () => {
    expect(foldName("  José-María O'Neil ")).toBe('josemariaoneil')
    expect(foldName('ZOË')).toBe(foldName('zoe'))
  })

  it('counts one insertion, deletion, change or swap of neighbours as the same; two changes as different', () => {
    expect(withinOneEdit('quintero', 'quintero')).toBe(true)
    expect(withinOneEdit('quintero', 'quinteros')).toBe(true)
    expect(withinOneEdit('quintero', 'quinter')).toBe(true)
    expect(withinOneEdit('quintero', 'quintaro')).toBe(true)
    expect(withinOneEdit('quintero', 'qiuntero')).toBe(true)
    expect(withinOneEdit('quintero', 'quantaro')).toBe(false)
    expect(withinOneEdit('ab', 'ba')).toBe(true)
    expect(withinOneEdit('abc', 'cab')).toBe(false)
  })

  it('matches e-mails whatever their case and surrounding spaces', () => {
    expect(normaliseEmail('  Ana.Quintero@FERNHOLLOW.test ')).toBe('ana.quintero@fernhollow.test')
    expect(duplicateReasons(ana, other({ email: 'ana.quintero@fernhollow.test ' }))).toEqual(['email'])
    expect(duplicateReasons(ana, other({ email: '' }))).toEqual([])
  })

  it('matches the same E.164 phone', () => {
    expect(duplicateReasons(ana, other({ phone: '+12095550177' }))).toEqual(['phone'])
    expect(duplicateReasons(ana, other({ phone: '+12095550178' }))).toEqual([])
  })

  it('matches the same birth date with an accented, re-spaced, one-letter-off or swapped name, but not another birth date', () => {
    const born = ana.dateOfBirth
    expect(duplicateReasons(ana, other({ firstName: 'ÁNA', lastName: 'quin tero', dateOfBirth: born }))).toEqual(['name_and_birth_date'])
    expect(duplicateReasons(ana, other({ firstName: 'Ana', lastName: 'Quintera', dateOfBirth: born }))).toEqual(['name_and_birth_date'])
    expect(duplicateReasons(ana, other({ firstName: 'Quintero', lastName: 'Ana', dateOfBirth: born }))).toEqual(['name_and_birth_date'])
    expect(duplicateReasons(ana, other({ firstName: 'Ana', lastName: 'Quintero', dateOfBirth: '1984-07-10' }))).toEqual([])
    expect(duplicateReasons(ana, other({ firstName: 'Anna', lastName: 'Quinteros', dateOfBirth: born }))).toEqual([])
    expect(similarNames({ firstName: 'Ana', lastName: 'Quintero' }, { firstName: 'Ann', lastName: 'Quintero' })).toBe(true)
  })

  it('lists the strongest candidates first and leaves strangers out', () => {
    const strong = { ...ana, id: 1 }
    const weak = { ...other({ phone: ana.phone }), id: 2 }
    const stranger = { ...other({}), id: 3 }
    expect(findDuplicates(ana, [weak, stranger, strong]).map((match) => match.candidate.id)).toEqual([1, 2])
  })
})
