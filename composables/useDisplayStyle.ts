// The shared formatter (shared/utils/display-time.ts) bound to a site's display style: its zone,
// clock and date order, from the signed-in user's sites. Screens format every time and date through
// `styleOf(site)`; a site outside the list (or none yet) reads with the defaults in the given zone.
import type { DisplayStyle } from '#shared/types/display'
import { displayStyleOf } from '#shared/utils/display-time'

export function useDisplayStyle() {
  const session = useSessionStore()

  /**
   * The style of a site (by id), of the first of the user's sites in a zone (by zone name), or of the
   * selected site (no site given). A site
   * the user cannot see reads with the defaults in `zone` (an opening's own zone, say).
   */
  function styleOf(site: number | string | null | undefined, zone?: string): DisplayStyle {
    const found = site === null || site === undefined
      ? session.selectedSite
      : typeof site === 'number'
        ? session.sites.find((candidate) => candidate.id === site)
        : session.sites.find((candidate) => candidate.timeZone === site)
    return displayStyleOf(found, zone ?? (typeof site === 'string' ? site : session.selectedSite?.timeZone ?? 'UTC'))
  }

  /** The selected site's style. */
  const current = computed<DisplayStyle>(() => styleOf(session.selectedSite?.id))
  return { styleOf, current }
}
