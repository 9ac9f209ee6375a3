// A visit's text thread with the patient (texts sent, replies) and sending a front desk text.
import type { TextThreadDto } from '#shared/types/sms'

export function useTextThread(visitId: Ref<number>) {
  const thread = ref<TextThreadDto | null>(null)
  const error = ref<unknown>(null)

  async function load(): Promise<void> {
    try {
      thread.value = await $fetch<TextThreadDto>(`/api/visits/${visitId.value}/texts`)
      error.value = null
    } catch (caught) {
      error.value = caught
    }
  }

  async function send(body: string): Promise<void> {
    thread.value = await $fetch<TextThreadDto>(`/api/visits/${visitId.value}/texts`, { method: 'POST', body: { body } })
  }

  return { thread, error, load, send }
}
