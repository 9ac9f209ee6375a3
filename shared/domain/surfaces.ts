// Surface strings such as 'MOD', 'do' or 'M, I, F' read as a set of surfaces for one tooth.
//
// Canonical order, as the trade writes them: mesial first, then occlusal or incisal, then distal,
// then buccal or facial, then lingual (MOD, MODBL, MIDFL). When there is no mesial surface a distal
// one leads, so a distal-occlusal reads 'DO' rather than 'OD'. The order is a pure function of
// the set, so equal sets always produce equal strings.
import { DomainValidationError } from './errors'
import { toothLabel } from './teeth'
import type { Surface, Tooth, ToothNotation } from '../types/teeth'

const SURFACE_NAMES: Record<Surface, string> = {
  M: 'mesial',
  O: 'occlusal',
  I: 'incisal',
  D: 'distal',
  B: 'buccal',
  F: 'facial',
  L: 'lingual',
}

const POSTERIOR_SURFACES: readonly Surface[] = ['M', 'O', 'D', 'B', 'L']
const ANTERIOR_SURFACES: readonly Surface[] = ['M', 'I', 'D', 'F', 'L']
const SEPARATORS = /[\s,]+/g

export interface ParsedSurfaces {
  surfaces: Surface[]
  /** Plain sentences about letters that were read as another (for example F on a molar). */
  notes: string[]
}

export interface SurfaceParseOptions {
  field?: string
  /** Notation used to name the tooth in messages. */
  notation?: ToothNotation
}

export function surfaceName(surface: Surface): string {
  return SURFACE_NAMES[surface]
}

/** The surfaces the UI offers as toggles for this tooth, in canonical order. */
export function validSurfacesFor(tooth: Tooth): Surface[] {
  return [...(tooth.region === 'posterior' ? POSTERIOR_SURFACES : ANTERIOR_SURFACES)]
}

/** Sorts a set of surfaces into the canonical order described at the top of this file. */
export function orderSurfaces(surfaces: Iterable<Surface>): Surface[] {
  const set = new Set(surfaces)
  const distalLeads = set.has('D') && !set.has('M')
  const order: Surface[] = distalLeads ? ['D', 'O', 'I', 'B', 'F', 'L'] : ['M', 'O', 'I', 'D', 'B', 'F', 'L']
  return order.filter((surface) => set.has(surface))
}

export function formatSurfaces(surfaces: Iterable<Surface>): string {
  return orderSurfaces(surfaces).join('')
}

interface LetterReading {
  surface: Surface
  note?: string
}

// B and F name the same outer surface (buccal on posteriors, facial on anteriors), and palatal is
// the maxillary lingual, so those letters are accepted with a note. O and I are different
// surfaces and are refused on the wrong tooth rather than guessed.
function readLetter(letter: string, tooth: Tooth, where: string, field: string): LetterReading {
  const posterior = tooth.region === 'posterior'
  switch (letter) {
    case 'M':
    case 'D':
    case 'L':
      return { surface: letter }
    case 'O':
      if (posterior) return { surface: 'O' }
      throw new DomainValidationError(field, `O (occlusal) is for posterior teeth; use I (incisal) on ${where}`)
    case 'I':
      if (!posterior) return { surface: 'I' }
      throw new DomainValidationError(field, `I (incisal) is for anterior teeth; use O (occlusal) on ${where}`)
    case 'B':
      if (posterior) return { surface: 'B' }
      return { surface: 'F', note: `B read as F (facial) on anterior ${where}` }
    case 'F':
      if (!posterior) return { surface: 'F' }
      return { surface: 'B', note: `F read as B (buccal) on posterior ${where}` }
    case 'P':
      if (tooth.arch === 'maxillary') return { surface: 'L', note: `P (palatal) read as L (lingual) on ${where}` }
      throw new DomainValidationError(field, `P (palatal) is only for upper teeth; use L (lingual) on ${where}`)
    default:
      throw new DomainValidationError(
        field,
        `'${letter}' is not a tooth surface; ${where} has ${validSurfacesFor(tooth).join(', ')}`,
      )
  }
}

/** Reads a surface string for a tooth; throws DomainValidationError naming the bad letter and the tooth. */
export function parseSurfaces(input: string, tooth: Tooth, options: SurfaceParseOptions = {}): ParsedSurfaces {
  const field = options.field ?? 'surfaces'
  const where = toothLabel(tooth, options.notation ?? 'universal')
  const letters = [...input.replace(SEPARATORS, '').toUpperCase()]
  if (letters.length === 0) throw new DomainValidationError(field, `No surfaces given for ${where}`)

  const seen = new Set<Surface>()
  const notes: string[] = []
  for (const letter of letters) {
    const reading = readLetter(letter, tooth, where, field)
    if (seen.has(reading.surface)) {
      const alias = letter === reading.surface ? '' : ` (${letter} means ${reading.surface} here)`
      throw new DomainValidationError(field, `Surface ${reading.surface} is given twice for ${where}${alias}`)
    }
    seen.add(reading.surface)
    if (reading.note) notes.push(reading.note)
  }
  return { surfaces: orderSurfaces(seen), notes }
}
