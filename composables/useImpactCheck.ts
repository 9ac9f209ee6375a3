// Impact before saving (issue 13 §1): a change that can strand booked visits is first sent with
// `dryRun`; when it would strand some (or is destructive: deleting a shift, deactivating a person or
// a room) the screen asks, through FormImpactDialog, before the real save.
import type { StrandedPreview, StrandedVisitDto } from '#shared/types/rebook'
import { strandedHeading } from '#shared/domain/stranding'

export interface ImpactAsk {
  /** What the change is, e.g. "Time off for Dr Ada Vale". */
  title: string
  /** "3 booked visits would lose their dentist", or the destructive question when none would. */
  heading: string
  visits: StrandedVisitDto[]
  confirmLabel: string
  /** What the change does, one line each (e.g. both halves of a rota move), shown above the visits. */
  details?: string[]
}

export interface ImpactRequest {
  url: string
  method: 'POST' | 'PATCH' | 'PUT' | 'DELETE'
  body?: Record<string, unknown>
  title: string
  /** A destructive action always asks, naming what it affects (e.g. "Delete this shift?"). */
  destructive?: string
  /** Set when the change takes a provider away: the heading says they would lose their dentist. */
  loses?: 'dentist' | 'hygienist'
  /** The save button's words when visits would be stranded; default "Save and put them on the Rebook list". */
  confirmLabel?: string
}

export function useImpactCheck() {
  const ask = ref<ImpactAsk | null>(null)
  let answer: ((proceed: boolean) => void) | null = null

  /** True when the change may go ahead: nothing stranded and nothing destructive, or the user said so. */
  async function confirmChange(request: ImpactRequest): Promise<boolean> {
    const preview = await $fetch<StrandedPreview>(request.url, request.method === 'DELETE'
      ? { method: 'DELETE', query: { dryRun: 'true' } }
      : { method: request.method, body: { ...request.body, dryRun: true } })
    const visits = preview.strandedVisits
    if (visits.length === 0 && !request.destructive) return true
    return askFirst({
      title: request.title,
      heading: visits.length ? strandedHeading(visits.length, request.loses) : request.destructive!,
      visits,
      confirmLabel: visits.length ? request.confirmLabel ?? 'Save and put them on the Rebook list' : request.title,
    })
  }

  /** Asks in the same dialog when the screen made the preview itself (Balance's rota move, a move offer): true to go ahead. */
  function askFirst(next: ImpactAsk): Promise<boolean> {
    ask.value = next
    return new Promise<boolean>((resolve) => { answer = resolve })
  }

  function respond(proceed: boolean): void {
    ask.value = null
    answer?.(proceed)
    answer = null
  }

  return { ask, askFirst, confirmChange, respond }
}
