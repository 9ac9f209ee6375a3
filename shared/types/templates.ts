// A chair-time template as stored: one version of a code.
import type { ChairTimeTemplate, PlanItemSummary, PlanSegment } from './chair-time'

export interface StoredTemplate extends ChairTimeTemplate {
  id: number
  version: number
  /** The newest version of its code. */
  current: boolean
  /** Deactivated templates are kept for the visits booked with them but cannot be booked. */
  active: boolean
  createdAt: string
}

export interface ChairTimeResponse {
  chairMinutes: number
  providerMinutes: number
  assistantMinutes: number
  numbingMinutes: number
  unitMinutes: number
  segments: Array<Pick<PlanSegment, 'kind' | 'label' | 'startMinute' | 'endMinute'>>
  explanation: string
  items: PlanItemSummary[]
}
