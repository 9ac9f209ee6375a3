// Where each Rota entry sits in a day column: minutes from the top of the grid, and side-by-side
// lanes when shifts overlap (two hygienists on the same morning).
import type { RotaEntry } from '#shared/types/rota-api'
import { minutesOf } from '#shared/schemas/local-time'

export interface PlacedEntry {
  entry: RotaEntry
  startMinutes: number
  endMinutes: number
  lane: number
  lanes: number
}

/** Visible hours: 07:00–18:00 at least, widened to whatever the week holds. */
export function hourRange(entries: readonly RotaEntry[]): { first: number; last: number } {
  let first = 7
  let last = 18
  for (const entry of entries) {
    if (entry.localStart === null || entry.localEnd === null) continue
    first = Math.min(first, Math.floor(minutesOf(entry.localStart) / 60))
    last = Math.max(last, Math.ceil(minutesOf(entry.localEnd) / 60))
  }
  return { first, last }
}

/** Greedy lanes for overlapping entries of one day; each overlapping group shares one lane count. */
export function placeDay(entries: readonly RotaEntry[]): PlacedEntry[] {
  const timed = entries
    .filter((entry) => entry.localStart !== null && entry.localEnd !== null)
    .map((entry) => ({ entry, startMinutes: minutesOf(entry.localStart!), endMinutes: minutesOf(entry.localEnd!), lane: 0, lanes: 1 }))
    .sort((a, b) => a.startMinutes - b.startMinutes || b.endMinutes - a.endMinutes)
  let group: PlacedEntry[] = []
  let groupEnd = -1
  const laneEnds: number[] = []
  const closeGroup = () => {
    const lanes = Math.max(1, ...group.map((placed) => placed.lane + 1))
    for (const placed of group) placed.lanes = lanes
    group = []
    laneEnds.length = 0
  }
  for (const placed of timed) {
    if (placed.startMinutes >= groupEnd && group.length) closeGroup()
    let lane = laneEnds.findIndex((end) => end <= placed.startMinutes)
    if (lane < 0) lane = laneEnds.length
    laneEnds[lane] = placed.endMinutes
    placed.lane = lane
    group.push(placed)
    groupEnd = Math.max(groupEnd, placed.endMinutes)
  }
  if (group.length) closeGroup()
  return timed
}
