import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { DomainValidationError } from '../../../../shared/domain/errors'
import { formatSurfaces, orderSurfaces, parseSurfaces, validSurfacesFor } from '../../../../shared/domain/surfaces'
import { allTeeth, parseTooth } from '../../../../shared/domain/teeth'

const lowerMolar = parseTooth('19', 'universal')
const upperPremolar = parseTooth('5', 'universal')
const upperIncisor = parseTooth('8', 'universal')
const lowerIncisor = parseTooth('24', 'universal')
const lowerCanine = parseTooth('27', 'universal')
const primaryMolar = parseTooth('K', 'universal')

function reasonOf(run: () => unknown): string {
  try {
    run()
  } catch (error) {
    if (error instanceof DomainValidationError) return error.reason
    throw error
  }
  throw new Error('expected a DomainValidationError')
}

describe('validSurfacesFor', () => {
  // check-values.md "Surfaces": posterior M, O, D, B, L; anterior M, I, D, F, L.
  it('offers M O D B L on posterior teeth, including primary molars', () => {
    for (const tooth of [lowerMolar, upperPremolar, primaryMolar]) {
      expect(new Set(validSurfacesFor(tooth))).toEqual(new Set(['M', 'O', 'D', 'B', 'L']))
    }
  })

  it('offers M I D F L on anterior teeth', () => {
    for (const tooth of [upperIncisor, lowerIncisor, lowerCanine]) {
      expect(new Set(validSurfacesFor(tooth))).toEqual(new Set(['M', 'I', 'D', 'F', 'L']))
    }
  })

  it('has five surfaces on every tooth', () => {
    for (const tooth of allTeeth()) expect(validSurfacesFor(tooth)).toHaveLength(5)
  })
})

describe('parseSurfaces', () => {
  it('reads MOD on a lower molar', () => {
    expect(parseSurfaces('MOD', lowerMolar)).toEqual({ surfaces: ['M', 'O', 'D'], notes: [] })
  })

  it('ignores case, spaces and commas', () => {
    expect(parseSurfaces('m, o d', lowerMolar).surfaces).toEqual(['M', 'O', 'D'])
    expect(parseSurfaces(' do ', upperPremolar).surfaces).toEqual(['D', 'O'])
  })

  it('puts surfaces in the canonical order whatever the input order', () => {
    expect(parseSurfaces('DOM', lowerMolar).surfaces).toEqual(['M', 'O', 'D'])
    expect(parseSurfaces('LBDOM', lowerMolar).surfaces).toEqual(['M', 'O', 'D', 'B', 'L'])
    expect(parseSurfaces('od', lowerMolar).surfaces).toEqual(['D', 'O'])
    expect(parseSurfaces('FIM', upperIncisor).surfaces).toEqual(['M', 'I', 'F'])
  })

  it('reads MIF on an anterior tooth', () => {
    expect(parseSurfaces('MIF', upperIncisor)).toEqual({ surfaces: ['M', 'I', 'F'], notes: [] })
  })

  it('reads F as B on a posterior tooth, with a note', () => {
    const parsed = parseSurfaces('MODF', lowerMolar)
    expect(parsed.surfaces).toEqual(['M', 'O', 'D', 'B'])
    expect(parsed.notes).toEqual(['F read as B (buccal) on posterior tooth 19'])
  })

  it('reads B as F on an anterior tooth, with a note', () => {
    const parsed = parseSurfaces('mb', upperIncisor)
    expect(parsed.surfaces).toEqual(['M', 'F'])
    expect(parsed.notes).toEqual(['B read as F (facial) on anterior tooth 8'])
  })

  it('reads P (palatal) as L on upper teeth only', () => {
    // check-values.md: maxillary lingual is also called palatal.
    expect(parseSurfaces('MP', upperIncisor).surfaces).toEqual(['M', 'L'])
    expect(parseSurfaces('MP', upperIncisor).notes[0]).toContain('P (palatal) read as L')
    expect(reasonOf(() => parseSurfaces('P', lowerMolar))).toContain('tooth 19')
  })

  it('refuses O on an anterior tooth and I on a posterior tooth, naming letter and tooth', () => {
    const onIncisor = reasonOf(() => parseSurfaces('MO', upperIncisor))
    expect(onIncisor).toContain('O (occlusal)')
    expect(onIncisor).toContain('tooth 8')
    const onMolar = reasonOf(() => parseSurfaces('I', lowerMolar))
    expect(onMolar).toContain('I (incisal)')
    expect(onMolar).toContain('tooth 19')
  })

  it('refuses an unknown letter, naming it and the tooth', () => {
    const reason = reasonOf(() => parseSurfaces('MXD', lowerMolar))
    expect(reason).toContain("'X'")
    expect(reason).toContain('tooth 19')
  })

  it('refuses a repeated letter, also when a synonym repeats it', () => {
    expect(reasonOf(() => parseSurfaces('MOM', lowerMolar))).toMatch(/M is given twice for tooth 19/)
    expect(reasonOf(() => parseSurfaces('BF', lowerMolar))).toMatch(/B is given twice.*F means B/)
  })

  it('refuses an empty string', () => {
    expect(reasonOf(() => parseSurfaces('', lowerMolar))).toContain('tooth 19')
    expect(() => parseSurfaces(' , ', lowerMolar)).toThrow(DomainValidationError)
  })

  it('names the tooth in the notation asked for and uses the given field', () => {
    try {
      parseSurfaces('Z', lowerMolar, { field: 'items.1.surfaces', notation: 'iso' })
      expect.unreachable()
    } catch (error) {
      expect(error).toBeInstanceOf(DomainValidationError)
      if (!(error instanceof DomainValidationError)) return
      expect(error.field).toBe('items.1.surfaces')
      expect(error.reason).toContain('tooth 36')
    }
  })

  it('gives the same canonical set for any order of the same letters (property)', () => {
    const toothAndLetters = fc
      .constantFrom(...allTeeth())
      .chain((tooth) => fc.tuple(fc.constant(tooth), fc.shuffledSubarray(validSurfacesFor(tooth), { minLength: 1 })))
    fc.assert(
      fc.property(toothAndLetters, fc.constantFrom('', ' ', ', '), ([tooth, letters], separator) => {
        const parsed = parseSurfaces(letters.join(separator).toLowerCase(), tooth)
        expect(parsed.surfaces).toEqual(orderSurfaces(letters))
        expect(new Set(parsed.surfaces)).toEqual(new Set(letters))
        expect(parsed.notes).toEqual([])
        expect(parseSurfaces(formatSurfaces(parsed.surfaces), tooth).surfaces).toEqual(parsed.surfaces)
      }),
    )
  })
})
