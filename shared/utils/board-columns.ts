// The Chairboard draws one site day with one column per operatory on a single time grid. The grid
// library lays columns out as days, so column i is drawn as "board date + i days" on a floating
// (UTC-as-wall-clock) axis. These functions translate between real instants and that layout,
// always through the site's IANA zone, never the browser's.
import { DateTime } from 'luxon'

/** 'YYYY-MM-DDTHH:mm:ss' floating wall time for an instant, placed in column `index`. */
export function toColumnTime(utcIso: string, zone: string, boardDate: string, index: number): string {
  const local = DateTime.fromISO(utcIso, { zone: 'utc' }).setZone(zone)
  const dayOffset = Math.round(local.startOf('day').diff(DateTime.fromISO(boardDate, { zone }).startOf('day'), 'days').days)
  const column = DateTime.fromISO(boardDate, { zone: 'utc' }).plus({ days: index + dayOffset })
  return `${column.toISODate()}T${local.toFormat('HH:mm:ss')}`
}

/** Back from a drawn position (a Date whose UTC fields hold column date and wall time). */
export function fromColumnTime(drawn: Date, zone: string, boardDate: string): { columnIndex: number; startUtc: string } {
  const floating = DateTime.fromJSDate(drawn, { zone: 'utc' })
  const columnIndex = Math.round(floating.startOf('day').diff(DateTime.fromISO(boardDate, { zone: 'utc' }), 'days').days)
  const wall = DateTime.fromISO(boardDate, { zone }).set({ hour: floating.hour, minute: floating.minute, second: 0, millisecond: 0 })
  return { columnIndex, startUtc: wall.toUTC().toISO({ suppressMilliseconds: true })! }
}
