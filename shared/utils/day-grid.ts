// Placing timed things on a day column (My day, the week views, the Rota grid): which hours the
// grid shows and side-by-side lanes for what overlaps. Minutes are minutes after local midnight.

export interface MinuteSpan {
  startMinutes: number
  endMinutes: number
}

/** Visible hours of a day: 07:00–18:00 at least, widened to whatever the spans need (within 0–24). */
export function visibleHours(spans: readonly MinuteSpan[]): { first: number; last: number } {
  let first = 7
  let last = 18
  for (const span of spans) {
    first = Math.min(first, Math.max(0, Math.floor(span.startMinutes / 60)))
    last = Math.max(last, Math.min(24, Math.ceil(span.endMinutes / 60)))
  }
  return { first, last }
}

export interface Lane<T> {
  item: T
  lane: number
  lanes: number
}

/** Side-by-side lanes for overlapping spans (greedy); every overlapping group shares one lane count. */
export function laneSpans<T extends MinuteSpan>(spans: readonly T[]): Lane<T>[] {
  const sorted = [...spans].sort((a, b) => a.startMinutes - b.startMinutes || b.endMinutes - a.endMinutes)
  const placed: Lane<T>[] = []
  let group: Lane<T>[] = []
  let groupEnd = -Infinity
  let laneEnds: number[] = []
  const close = () => {
    const lanes = Math.max(1, ...group.map((entry) => entry.lane + 1))
    for (const entry of group) entry.lanes = lanes
    group = []
    laneEnds = []
  }
  for (const item of sorted) {
    if (item.startMinutes >= groupEnd && group.length) close()
    let lane = laneEnds.findIndex((end) => end <= item.startMinutes)
    if (lane < 0) lane = laneEnds.length
    laneEnds[lane] = item.endMinutes
    const entry = { item, lane, lanes: 1 }
    group.push(entry)
    placed.push(entry)
    groupEnd = Math.max(groupEnd, item.endMinutes)
  }
  if (group.length) close()
  return placed
}
