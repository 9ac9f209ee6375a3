import { describe, expect, it } from 'vitest'
import { DomainValidationError } from '../../../../shared/domain/errors'
import { allTeeth, formatTooth, parseTooth, quadrantLabel, toothFromIso, toothLabel, toothName } from '../../../../shared/domain/teeth'
import type { ToothType } from '../../../../shared/types/teeth'

// check-values.md, "Tooth notation: Universal ↔ ISO 3950" (ISO 3950; ADA Universal Numbering System):
// every tooth written out by hand, with its type from the same section.
const TABLE: ReadonlyArray<readonly [universal: string, iso: string, type: ToothType]> = [
  ['1', '18', 'molar'], ['2', '17', 'molar'], ['3', '16', 'molar'], ['4', '15', 'premolar'],
  ['5', '14', 'premolar'], ['6', '13', 'canine'], ['7', '12', 'incisor'], ['8', '11', 'incisor'],
  ['9', '21', 'incisor'], ['10', '22', 'incisor'], ['11', '23', 'canine'], ['12', '24', 'premolar'],
  ['13', '25', 'premolar'], ['14', '26', 'molar'], ['15', '27', 'molar'], ['16', '28', 'molar'],
  ['17', '38', 'molar'], ['18', '37', 'molar'], ['19', '36', 'molar'], ['20', '35', 'premolar'],
  ['21', '34', 'premolar'], ['22', '33', 'canine'], ['23', '32', 'incisor'], ['24', '31', 'incisor'],
  ['25', '41', 'incisor'], ['26', '42', 'incisor'], ['27', '43', 'canine'], ['28', '44', 'premolar'],
  ['29', '45', 'premolar'], ['30', '46', 'molar'], ['31', '47', 'molar'], ['32', '48', 'molar'],
  ['A', '55', 'molar'], ['B', '54', 'molar'], ['C', '53', 'canine'], ['D', '52', 'incisor'], ['E', '51', 'incisor'],
  ['F', '61', 'incisor'], ['G', '62', 'incisor'], ['H', '63', 'canine'], ['I', '64', 'molar'], ['J', '65', 'molar'],
  ['K', '75', 'molar'], ['L', '74', 'molar'], ['M', '73', 'canine'], ['N', '72', 'incisor'], ['O', '71', 'incisor'],
  ['P', '81', 'incisor'], ['Q', '82', 'incisor'], ['R', '83', 'canine'], ['S', '84', 'molar'], ['T', '85', 'molar'],
]

// check-values.md, "Arches": maxillary Universal 1–16 and A–J.
const MAXILLARY_UNIVERSAL = new Set([...Array.from({ length: 16 }, (_, i) => String(i + 1)), ...'ABCDEFGHIJ'])
// check-values.md: ISO 3950 first digit is the quadrant; primary 5–8 in the same order as 1–4.
const QUADRANT_BY_ISO_DIGIT: Record<string, number> = { 1: 1, 2: 2, 3: 3, 4: 4, 5: 1, 6: 2, 7: 3, 8: 4 }

describe('tooth table', () => {
  it('has 52 teeth, 32 permanent and 20 primary', () => {
    const teeth = allTeeth()
    expect(teeth).toHaveLength(52)
    expect(teeth.filter((t) => t.dentition === 'permanent')).toHaveLength(32)
    expect(teeth.filter((t) => t.dentition === 'primary')).toHaveLength(20)
    expect(new Set(teeth.map((t) => t.iso)).size).toBe(52)
    expect(new Set(teeth.map((t) => t.universal)).size).toBe(52)
  })

  it.each(TABLE)('Universal %s is ISO %s, a %s', (universal, iso, type) => {
    const fromUniversal = parseTooth(universal, 'universal')
    const fromIso = parseTooth(iso, 'iso')
    expect(fromUniversal.iso).toBe(iso)
    expect(fromIso.universal).toBe(universal)
    expect(fromUniversal).toEqual(fromIso)
    expect(fromUniversal.type).toBe(type)
    expect(fromUniversal.arch).toBe(MAXILLARY_UNIVERSAL.has(universal) ? 'maxillary' : 'mandibular')
    expect(fromUniversal.quadrant).toBe(QUADRANT_BY_ISO_DIGIT[iso.charAt(0)])
    expect(fromUniversal.dentition).toBe(/^[A-T]$/.test(universal) ? 'primary' : 'permanent')
    expect(fromUniversal.position).toBe(Number(iso.charAt(1)))
  })

  it('covers exactly the teeth of the written-out table', () => {
    const expected = TABLE.map(([universal, iso]) => `${universal}=${iso}`).sort()
    expect(allTeeth().map((t) => `${t.universal}=${t.iso}`).sort()).toEqual(expected)
  })

  it('calls incisors and canines anterior, premolars and molars posterior', () => {
    for (const tooth of allTeeth()) {
      const anterior = tooth.type === 'incisor' || tooth.type === 'canine'
      expect(tooth.region).toBe(anterior ? 'anterior' : 'posterior')
    }
  })

  it('has no primary premolars', () => {
    // check-values.md: primary types (no premolars).
    expect(allTeeth().filter((t) => t.dentition === 'primary' && t.type === 'premolar')).toEqual([])
  })

  it('matches the cross-check ISO 46 = Universal 30', () => {
    // check-values.md cross-check
    expect(parseTooth('46', 'iso').universal).toBe('30')
  })
})

describe('parseTooth', () => {
  it('reads primary letters in either case and trims spaces', () => {
    expect(parseTooth('k', 'universal').iso).toBe('75')
    expect(parseTooth(' T ', 'universal').iso).toBe('85')
    expect(parseTooth(' 36 ', 'iso').universal).toBe('19')
  })

  it('round-trips every tooth through both notations', () => {
    for (const tooth of allTeeth()) {
      expect(parseTooth(formatTooth(tooth, 'universal'), 'universal')).toEqual(tooth)
      expect(parseTooth(formatTooth(tooth, 'iso'), 'iso')).toEqual(tooth)
      expect(toothFromIso(tooth.iso)).toEqual(tooth)
    }
  })

  it.each(['0', '33', 'U', 'u', '', '   ', 'abc', '-1', '1.5', '100', 'AA'])('refuses Universal %j', (input) => {
    expect(() => parseTooth(input, 'universal')).toThrow(DomainValidationError)
  })

  it.each(['19', '59', '10', '49', '56', '66', '90', '0', '', 'abc', '3 6', '136', 'A'])('refuses ISO %j', (input) => {
    expect(() => parseTooth(input, 'iso')).toThrow(DomainValidationError)
  })

  it('names the input and the field in the error', () => {
    const error = catchError(() => parseTooth('33', 'universal', 'items.0.tooth'))
    expect(error.field).toBe('items.0.tooth')
    expect(error.reason).toContain("'33'")
    expect(error.message).toBe(error.reason)
    expect(catchError(() => parseTooth('19', 'iso')).field).toBe('tooth')
    expect(catchError(() => parseTooth('19', 'iso')).reason).toContain("'19'")
  })

  it('says a tooth is required when the input is empty', () => {
    expect(catchError(() => parseTooth('', 'iso')).reason).toMatch(/required/)
  })
})

describe('names and labels', () => {
  it('labels quadrants in ISO 3950 order', () => {
    // ISO 3950: 1 upper right, 2 upper left, 3 lower left, 4 lower right
    expect([1, 2, 3, 4].map((q) => quadrantLabel(q as 1 | 2 | 3 | 4))).toEqual(['upper right', 'upper left', 'lower left', 'lower right'])
  })

  it('names teeth in plain words', () => {
    expect(toothName(parseTooth('19', 'universal'))).toBe('lower left first molar')
    expect(toothName(parseTooth('C', 'universal'))).toBe('upper right primary canine')
    expect(toothName(parseTooth('48', 'iso'))).toBe('lower right third molar')
  })

  it('formats a tooth in the reader notation', () => {
    const tooth = parseTooth('36', 'iso')
    expect(formatTooth(tooth, 'universal')).toBe('19')
    expect(toothLabel(tooth, 'iso')).toBe('tooth 36')
  })
})

function catchError(run: () => unknown): DomainValidationError {
  try {
    run()
  } catch (error) {
    if (error instanceof DomainValidationError) return error
    throw error
  }
  throw new Error('expected a DomainValidationError')
}
