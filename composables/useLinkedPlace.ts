// A link into a screen that names a place and time (`?site=&date=`, `?week=`, `?provider=`), as the
// Balance figures give: the site is selected, and the valid date (yyyy-MM-dd) or id handed back;
// anything else in the address is ignored.
import { calendarDate } from '#shared/schemas/local-time'

const DATE = calendarDate('must be a date such as 2027-01-11')

export function useLinkedPlace() {
  const route = useRoute()
  const session = useSessionStore()
  const site = Number(route.query.site)
  if (Number.isInteger(site) && site > 0) session.selectSite(site)
  const dateOf = (key: string): string | null => {
    const parsed = DATE.safeParse(route.query[key])
    return parsed.success ? parsed.data : null
  }
  const idOf = (key: string): number | null => {
    const id = Number(route.query[key])
    return Number.isInteger(id) && id > 0 ? id : null
  }
  return { dateOf, idOf }
}
