// Field errors and one banner for a form, filled from zod (before sending) or from the API's
// 400 (data.issues) and 409 (message) answers.
import type { ZodType } from 'zod'
import { apiErrorBody } from '#shared/utils/api-errors'

export function useFormErrors() {
  const fields = ref<Record<string, string>>({})
  const banner = ref<string | null>(null)

  function clear(): void {
    fields.value = {}
    banner.value = null
  }

  /** Parses with the shared schema; on failure fills the field errors and returns null. */
  function check<T>(schema: ZodType<T>, value: unknown): T | null {
    clear()
    const parsed = schema.safeParse(value)
    if (parsed.success) return parsed.data
    for (const issue of parsed.error.issues) {
      const key = issue.path.join('.') || '(form)'
      fields.value[key] ??= issue.message
    }
    banner.value = 'Please correct the marked fields.'
    return null
  }

  function fromResponse(caught: unknown): void {
    clear()
    const body = apiErrorBody(caught)
    const issues = body?.data?.issues
    if (body?.statusCode === 400 && issues?.length) {
      for (const issue of issues) fields.value[issue.field] ??= issue.reason
      banner.value = 'Please correct the marked fields.'
      return
    }
    banner.value = body?.message ?? 'Saving failed. Try again.'
  }

  const busy = ref(false)

  /** Runs a save or delete: busy while it runs, its 400/409 shown on the form. Undefined when refused. */
  async function submit<T>(request: () => Promise<T>): Promise<T | undefined> {
    busy.value = true
    try {
      return await request()
    } catch (caught) {
      fromResponse(caught)
      return undefined
    } finally {
      busy.value = false
    }
  }

  return { fields, banner, busy, clear, check, fromResponse, submit }
}
