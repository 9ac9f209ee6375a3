// Tooth and surface vocabulary shared by client and server.
// Canonical storage form of a tooth is its ISO 3950 two-digit string ('36').

export const TOOTH_NOTATIONS = ['universal', 'iso'] as const
export type ToothNotation = (typeof TOOTH_NOTATIONS)[number]

export type Dentition = 'permanent' | 'primary'
export type Arch = 'maxillary' | 'mandibular'
/** ISO 3950 quadrant of the permanent dentition: 1 upper right, 2 upper left, 3 lower left, 4 lower right. */
export type Quadrant = 1 | 2 | 3 | 4
export type ToothType = 'incisor' | 'canine' | 'premolar' | 'molar'
/** Incisors and canines are anterior; premolars and molars posterior. */
export type ToothRegion = 'anterior' | 'posterior'

export interface Tooth {
  /** ISO 3950 two-digit code, the stored form. */
  iso: string
  /** Universal number (1–32) or letter (A–T, upper case). */
  universal: string
  dentition: Dentition
  arch: Arch
  /** Primary quadrants 5–8 are reported as 1–4 so that anaesthesia groups by side of the mouth. */
  quadrant: Quadrant
  /** Position from the midline: 1–8 permanent, 1–5 primary (the second ISO digit). */
  position: number
  type: ToothType
  region: ToothRegion
}

/** Surface letters, in the order Cuspline lists them (see shared/domain/surfaces.ts). */
export const SURFACE_LETTERS = ['M', 'O', 'I', 'D', 'B', 'F', 'L'] as const
export type Surface = (typeof SURFACE_LETTERS)[number]

/** Black's cavity classes; VI is the later addition to Black's five. */
export type BlackClass = 'I' | 'II' | 'III' | 'IV' | 'V' | 'VI'

/** What the clinician marks about a lesion beyond its surfaces (used for Black's class). */
export interface LesionMarks {
  /** The lesion is in the gingival third of a facial or lingual surface. */
  cervical?: boolean
  /** An anterior proximal lesion takes in the incisal angle. */
  incisalAngle?: boolean
  /** The lesion is on a cusp tip (posterior teeth; on a canine it is read as the incisal edge). */
  cuspTip?: boolean
}
