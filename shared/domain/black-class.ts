// Black's cavity class from the tooth, its surfaces and what the clinician marks about the lesion.
// Definitions as taught in operative-dentistry textbooks (check-values.md, Sturdevant):
//   I   pits and fissures: occlusal of premolars and molars, facial/lingual pits of molars,
//       lingual of maxillary incisors
//   II  proximal (M or D) of posterior teeth
//   III proximal of anterior teeth, incisal angle not involved
//   IV  proximal of anterior teeth with the incisal angle (I with M or D, or the incisalAngle mark)
//   V   gingival (cervical) third of the facial or lingual surface of any tooth (cervical mark)
//   VI  incisal edge of anterior teeth (I without M or D) or cusp tip of posterior teeth (cuspTip mark)
// Where several could apply, the first in this order wins: V, II, IV, III, VI, I. The cervical mark
// comes first because it says where the lesion is, which the surface letters alone cannot.
import { DomainValidationError } from './errors'
import type { BlackClass, LesionMarks, Surface, Tooth } from '../types/teeth'

export type { LesionMarks }

export interface BlackClassResult {
  /** Null when no class fits, for example a facial smooth-surface lesion not marked cervical. */
  blackClass: BlackClass | null
  /** Why, in a short sentence the UI can show. */
  rule: string
}

function hasProximal(set: ReadonlySet<Surface>): boolean {
  return set.has('M') || set.has('D')
}

function hasFacialOrLingual(set: ReadonlySet<Surface>): boolean {
  return set.has('B') || set.has('F') || set.has('L')
}

function checkMarks(tooth: Tooth, set: ReadonlySet<Surface>, marks: LesionMarks): void {
  if (marks.cervical && !hasFacialOrLingual(set)) {
    throw new DomainValidationError('cervical', 'A cervical lesion is on the facial or lingual surface; include B/F or L')
  }
  if (marks.incisalAngle && tooth.region === 'posterior') {
    throw new DomainValidationError('incisalAngle', 'Only anterior teeth have an incisal angle')
  }
}

function classifyPosterior(tooth: Tooth, set: ReadonlySet<Surface>, marks: LesionMarks): BlackClassResult {
  if (hasProximal(set)) return { blackClass: 'II', rule: 'proximal surface of a posterior tooth' }
  if (marks.cuspTip) return { blackClass: 'VI', rule: 'cusp tip of a posterior tooth' }
  if (set.has('O')) return { blackClass: 'I', rule: 'occlusal pits and fissures' }
  if (tooth.type === 'molar') return { blackClass: 'I', rule: 'facial or lingual pit of a molar' }
  return { blackClass: null, rule: 'smooth facial or lingual surface of a premolar: mark it cervical for Class V' }
}

function classifyAnterior(tooth: Tooth, set: ReadonlySet<Surface>, marks: LesionMarks): BlackClassResult {
  if (hasProximal(set) || marks.incisalAngle) {
    return set.has('I') || marks.incisalAngle
      ? { blackClass: 'IV', rule: 'proximal surface of an anterior tooth including the incisal angle' }
      : { blackClass: 'III', rule: 'proximal surface of an anterior tooth, incisal angle not involved' }
  }
  if (set.has('I') || marks.cuspTip) return { blackClass: 'VI', rule: 'incisal edge of an anterior tooth' }
  if (set.has('L') && tooth.arch === 'maxillary' && tooth.type === 'incisor') {
    return { blackClass: 'I', rule: 'lingual pit of a maxillary incisor' }
  }
  return { blackClass: null, rule: 'smooth facial or lingual surface of an anterior tooth: mark it cervical for Class V' }
}

/** Black's class with the rule that chose it. Surfaces must already be valid for the tooth. */
export function classifyCavity(tooth: Tooth, surfaces: readonly Surface[], marks: LesionMarks = {}): BlackClassResult {
  if (surfaces.length === 0) throw new DomainValidationError('surfaces', 'A cavity class needs at least one surface')
  const set = new Set(surfaces)
  checkMarks(tooth, set, marks)
  if (marks.cervical) return { blackClass: 'V', rule: 'gingival third of a facial or lingual surface' }
  return tooth.region === 'posterior' ? classifyPosterior(tooth, set, marks) : classifyAnterior(tooth, set, marks)
}

export function blackClass(tooth: Tooth, surfaces: readonly Surface[], marks: LesionMarks = {}): BlackClass | null {
  return classifyCavity(tooth, surfaces, marks).blackClass
}
