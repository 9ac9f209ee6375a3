// Move a visit along its states from a screen: the change shows at once and is rolled back, with a
// message, when the server refuses it.
import type { VisitDto, BoardVisitDto } from '#shared/types/visits'
import { VISIT_STATE_LABELS, type VisitState } from '#shared/domain/visit-states'
import { apiErrorBody, apiErrorMessage } from '#shared/utils/api-errors'

function reasonOf(error: unknown): string {
  return apiErrorMessage(error, apiErrorBody(error)?.statusMessage ?? 'the server did not answer')
}

export function useVisitStateChange(visits: Ref<BoardVisitDto[] | null | undefined>) {
  const pendingId = ref<number | null>(null)
  const problem = ref<string | null>(null)

  /** useFetch data is a shallow ref: replace the visit, never mutate it, so every view redraws. */
  function patch(visitId: number, change: Partial<BoardVisitDto>): void {
    visits.value = (visits.value ?? []).map((entry) => (entry.id === visitId ? { ...entry, ...change } : entry))
  }

  async function changeState(visitId: number, to: VisitState): Promise<boolean> {
    const visit = visits.value?.find((entry) => entry.id === visitId)
    if (!visit || pendingId.value !== null) return false
    const before = { state: visit.state, rowVersion: visit.rowVersion }
    problem.value = null
    pendingId.value = visitId
    patch(visitId, { state: to })
    try {
      const saved = await $fetch<VisitDto>(`/api/visits/${visitId}/state`, {
        method: 'POST', body: { state: to, rowVersion: before.rowVersion },
      })
      // The whole answer: its previous state and time make the change undoable on screen at once.
      patch(visitId, saved)
      return true
    } catch (error) {
      patch(visitId, before)
      problem.value = `Could not mark ${visit.patientName} as ${VISIT_STATE_LABELS[to].toLowerCase()}: ${reasonOf(error)}`
      return false
    } finally {
      pendingId.value = null
    }
  }

  /** A visit the server answered with after another action (undo, anaesthetic given): shown at once. */
  function replace(saved: VisitDto): void {
    patch(saved.id, saved)
  }

  return { changeState, replace, pendingId, problem }
}
