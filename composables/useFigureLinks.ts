// Links from a Balance figure to the screen it summarises: a site's day on the Chairboard, or a
// provider's week on the Rota. Following one selects that site first (the Chairboard and the Rota
// show the selected site), then opens the day or the week.
import { mondayOf } from '#shared/utils/local-date'

export function useFigureLinks() {
  const session = useSessionStore()
  const board = useChairboardStore()

  const boardHref = (siteId: number, date: string) => `/chairboard?site=${siteId}&date=${date}`
  const rotaHref = (siteId: number, date: string, providerId?: number) =>
    `/rota?site=${siteId}&week=${mondayOf(date)}${providerId === undefined ? '' : `&provider=${providerId}`}`

  async function openBoard(siteId: number, date: string) {
    session.selectSite(siteId)
    board.date = date
    await navigateTo(boardHref(siteId, date))
  }

  async function openRota(siteId: number, date: string, providerId?: number) {
    session.selectSite(siteId)
    await navigateTo(rotaHref(siteId, date, providerId))
  }

  return { boardHref, rotaHref, openBoard, openRota }
}
