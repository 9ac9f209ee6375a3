// A chair-time template as stored: one version of a code.
import type { ChairTimeTemplate } from './chair-time'

export interface StoredTemplate extends ChairTimeTemplate {
  id: number
  version: number
  /** The newest version of its code. */
  current: boolean
  /** Deactivated templates are kept for the visits booked with them but cannot be booked. */
  active: boolean
  createdAt: string
}
