// Tooth identifiers: Universal (1–32, A–T) and ISO 3950 two-digit notation.
// The table is built once from the ISO structure (quadrant digit + position from the midline);
// the tests check it against the written-out table in check-values.md.
import { DomainValidationError } from './errors'
import type { Arch, Dentition, Quadrant, Tooth, ToothNotation, ToothRegion, ToothType } from '../types/teeth'

const PERMANENT_POSITIONS = 8
const PRIMARY_POSITIONS = 5
const QUADRANTS: readonly Quadrant[] = [1, 2, 3, 4]
const PRIMARY_LETTERS = 'ABCDEFGHIJKLMNOPQRST'

const QUADRANT_LABELS: Record<Quadrant, string> = {
  1: 'upper right',
  2: 'upper left',
  3: 'lower left',
  4: 'lower right',
}

export function quadrantLabel(quadrant: Quadrant): string {
  return QUADRANT_LABELS[quadrant]
}

function archOf(quadrant: Quadrant): Arch {
  return quadrant <= 2 ? 'maxillary' : 'mandibular'
}

function permanentType(position: number): ToothType {
  if (position <= 2) return 'incisor'
  if (position === 3) return 'canine'
  if (position <= 5) return 'premolar'
  return 'molar'
}

// Primary teeth have no premolars: positions 4 and 5 are the first and second primary molars.
function primaryType(position: number): ToothType {
  if (position <= 2) return 'incisor'
  if (position === 3) return 'canine'
  return 'molar'
}

function regionOf(type: ToothType): ToothRegion {
  return type === 'incisor' || type === 'canine' ? 'anterior' : 'posterior'
}

// Universal counts around the mouth from the upper right third molar, so its direction
// relative to the midline flips in each quadrant.
function permanentUniversal(quadrant: Quadrant, position: number): string {
  const numberByQuadrant: Record<Quadrant, number> = {
    1: 9 - position,
    2: 8 + position,
    3: 25 - position,
    4: 24 + position,
  }
  return String(numberByQuadrant[quadrant])
}

function primaryUniversal(quadrant: Quadrant, position: number): string {
  const indexByQuadrant: Record<Quadrant, number> = {
    1: 5 - position,
    2: 4 + position,
    3: 15 - position,
    4: 14 + position,
  }
  return PRIMARY_LETTERS.charAt(indexByQuadrant[quadrant])
}

function buildTooth(dentition: Dentition, quadrant: Quadrant, position: number): Tooth {
  const isPrimary = dentition === 'primary'
  const isoQuadrantDigit = isPrimary ? quadrant + 4 : quadrant
  const type = isPrimary ? primaryType(position) : permanentType(position)
  return {
    iso: `${isoQuadrantDigit}${position}`,
    universal: isPrimary ? primaryUniversal(quadrant, position) : permanentUniversal(quadrant, position),
    dentition,
    arch: archOf(quadrant),
    quadrant,
    position,
    type,
    region: regionOf(type),
  }
}

function buildAllTeeth(): Tooth[] {
  const teeth: Tooth[] = []
  for (const [dentition, positions] of [['permanent', PERMANENT_POSITIONS], ['primary', PRIMARY_POSITIONS]] as const) {
    for (const quadrant of QUADRANTS) {
      for (let position = 1; position <= positions; position++) {
        teeth.push(buildTooth(dentition, quadrant, position))
      }
    }
  }
  return teeth
}

const ALL_TEETH: readonly Tooth[] = Object.freeze(buildAllTeeth().map((tooth) => Object.freeze(tooth)))
const BY_ISO = new Map(ALL_TEETH.map((tooth) => [tooth.iso, tooth]))
const BY_UNIVERSAL = new Map(ALL_TEETH.map((tooth) => [tooth.universal, tooth]))

/** All 52 teeth: 32 permanent then 20 primary, each in ISO quadrant order. */
export function allTeeth(): Tooth[] {
  return [...ALL_TEETH]
}

/** The tooth for a stored ISO code, or undefined when the code is not a tooth. */
export function toothFromIso(iso: string): Tooth | undefined {
  return BY_ISO.get(iso.trim())
}

const NOTATION_NAMES: Record<ToothNotation, string> = {
  universal: 'Universal tooth number (1–32 or A–T)',
  iso: 'ISO 3950 tooth number (11–48 or 51–85)',
}

function lookUp(input: string, notation: ToothNotation): Tooth | undefined {
  if (notation === 'iso') return /^\d\d$/.test(input) ? BY_ISO.get(input) : undefined
  if (/^[a-t]$/i.test(input)) return BY_UNIVERSAL.get(input.toUpperCase())
  // Only plain numbers; '08' is read as 8, but '8.0' or '+8' are not tooth numbers.
  return /^\d{1,2}$/.test(input) ? BY_UNIVERSAL.get(String(Number(input))) : undefined
}

/** Reads a tooth written in the given notation; throws DomainValidationError naming the input. */
export function parseTooth(input: string, notation: ToothNotation, field = 'tooth'): Tooth {
  const trimmed = input.trim()
  if (trimmed === '') throw new DomainValidationError(field, `A tooth is required (${NOTATION_NAMES[notation]})`)
  const tooth = lookUp(trimmed, notation)
  if (!tooth) throw new DomainValidationError(field, `'${trimmed}' is not a ${NOTATION_NAMES[notation]}`)
  return tooth
}

export function formatTooth(tooth: Tooth, notation: ToothNotation): string {
  return notation === 'iso' ? tooth.iso : tooth.universal
}

/** "tooth 19" or "tooth 36", for messages and explanations in the reader's notation. */
export function toothLabel(tooth: Tooth, notation: ToothNotation): string {
  return `tooth ${formatTooth(tooth, notation)}`
}

const PERMANENT_NAMES = ['central incisor', 'lateral incisor', 'canine', 'first premolar', 'second premolar', 'first molar', 'second molar', 'third molar']
const PRIMARY_NAMES = ['central incisor', 'lateral incisor', 'canine', 'first molar', 'second molar']

/** Plain name such as "lower left first molar" or "upper right primary canine". */
export function toothName(tooth: Tooth): string {
  const names = tooth.dentition === 'primary' ? PRIMARY_NAMES : PERMANENT_NAMES
  const primary = tooth.dentition === 'primary' ? 'primary ' : ''
  return `${quadrantLabel(tooth.quadrant)} ${primary}${names[tooth.position - 1] ?? 'tooth'}`
}
