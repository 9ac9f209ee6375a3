import type { StoredTemplate } from '#shared/types/templates'

/** The current version of every template (inactive ones too, for the Templates screen). */
export function useTemplates() {
  return useFetch<StoredTemplate[]>('/api/templates', {
    key: 'templates-all',
    query: { includeInactive: 'true' },
    default: () => [],
  })
}
