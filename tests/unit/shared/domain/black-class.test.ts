// Expected classes: check-values.md "Black's cavity classes" (G. V. Black's classification as taught
// in operative-dentistry textbooks, e.g. Sturdevant's Art and Science of Operative Dentistry).
import { describe, expect, it } from 'vitest'
import { blackClass, classifyCavity } from '../../../../shared/domain/black-class'
import { DomainValidationError } from '../../../../shared/domain/errors'
import { parseSurfaces } from '../../../../shared/domain/surfaces'
import { parseTooth } from '../../../../shared/domain/teeth'
import type { BlackClass, LesionMarks } from '../../../../shared/types/teeth'

function classOf(universal: string, surfaces: string, marks: LesionMarks = {}): BlackClass | null {
  const tooth = parseTooth(universal, 'universal')
  return blackClass(tooth, parseSurfaces(surfaces, tooth).surfaces, marks)
}

describe("Black's classes, textbook examples", () => {
  it.each([
    ['30', 'O', 'occlusal of a lower molar'],
    ['5', 'O', 'occlusal of an upper premolar'],
    ['3', 'B', 'buccal pit of an upper molar'],
    ['19', 'L', 'lingual groove of a lower molar'],
    ['8', 'L', 'lingual pit of an upper central incisor'],
    ['7', 'L', 'lingual pit of an upper lateral incisor'],
  ])('Class I: tooth %s %s (%s)', (tooth, surfaces) => {
    expect(classOf(tooth, surfaces)).toBe('I')
  })

  it.each([
    ['19', 'MO'], ['4', 'DO'], ['30', 'MOD'], ['14', 'D'], ['K', 'MO'], ['3', 'MODBL'],
  ])('Class II: proximal of a posterior tooth, tooth %s %s', (tooth, surfaces) => {
    expect(classOf(tooth, surfaces)).toBe('II')
  })

  it.each([
    ['8', 'M'], ['7', 'DL'], ['24', 'MF'], ['6', 'D'], ['E', 'M'],
  ])('Class III: proximal of an anterior tooth without the incisal angle, tooth %s %s', (tooth, surfaces) => {
    expect(classOf(tooth, surfaces)).toBe('III')
  })

  it('Class IV: anterior proximal including the incisal angle', () => {
    expect(classOf('8', 'MI')).toBe('IV')
    expect(classOf('9', 'DIF')).toBe('IV')
    expect(classOf('9', 'D', { incisalAngle: true })).toBe('IV')
  })

  it('Class V: cervical third of a facial or lingual surface, any tooth', () => {
    expect(classOf('6', 'F', { cervical: true })).toBe('V')
    expect(classOf('19', 'B', { cervical: true })).toBe('V')
    expect(classOf('24', 'L', { cervical: true })).toBe('V')
  })

  it('Class VI: incisal edge of anterior teeth, cusp tip of posterior teeth', () => {
    expect(classOf('8', 'I')).toBe('VI')
    expect(classOf('22', 'IF')).toBe('VI')
    expect(classOf('19', 'O', { cuspTip: true })).toBe('VI')
  })

  it('gives no class where none fits, and says what is missing', () => {
    const tooth = parseTooth('8', 'universal')
    const result = classifyCavity(tooth, ['F'])
    expect(result.blackClass).toBeNull()
    expect(result.rule).toContain('cervical')
    // Lingual pits as Class I are a maxillary-incisor site, not a lower incisor one.
    expect(classOf('24', 'L')).toBeNull()
    expect(classOf('5', 'B')).toBeNull()
  })

  it('explains the rule it used', () => {
    const tooth = parseTooth('19', 'universal')
    expect(classifyCavity(tooth, ['M', 'O']).rule).toContain('proximal')
  })
})

describe("Black's class input checks", () => {
  it('refuses a cervical mark without a facial or lingual surface', () => {
    const tooth = parseTooth('19', 'universal')
    expect(() => blackClass(tooth, ['O'], { cervical: true })).toThrow(DomainValidationError)
  })

  it('refuses an incisal angle on a posterior tooth', () => {
    const tooth = parseTooth('19', 'universal')
    expect(() => blackClass(tooth, ['M', 'O'], { incisalAngle: true })).toThrow(/anterior/)
  })

  it('refuses no surfaces', () => {
    expect(() => blackClass(parseTooth('19', 'universal'), [])).toThrow(DomainValidationError)
  })
})
