// Openings grouped by distinct gap (issue 14, "Openings that help choose"): the search returns every
// grid start, so one free hour in a chair comes back as a dozen 5-minute variants. A gap is one chair
// with one provider and one free window: starts of the same chair and provider whose visits would
// overlap or touch belong to the same gap. Each gap shows its earliest start; the others stay
// choosable inside it.

export interface GroupableOpening {
  siteId: number
  operatoryId: number
  providerId: number
  startUtc: string
  endUtc: string
}

export interface OpeningGap<T extends GroupableOpening> {
  key: string
  /** Every start in the gap, earliest first; `starts[0]` is the one shown. */
  starts: T[]
  /** The free window the starts cover: the first start to the last visit's end. */
  fromUtc: string
  toUtc: string
}

/** Groups openings into gaps, ordered by each gap's earliest start (then by the order they came in). */
export function groupOpenings<T extends GroupableOpening>(openings: readonly T[]): OpeningGap<T>[] {
  const pairKey = (opening: T) => `${opening.siteId}-${opening.operatoryId}-${opening.providerId}`
  const sorted = openings
    .map((opening, index) => ({ opening, index }))
    .sort((a, b) => pairKey(a.opening).localeCompare(pairKey(b.opening)) || Date.parse(a.opening.startUtc) - Date.parse(b.opening.startUtc) || a.index - b.index)
  const gaps: (OpeningGap<T> & { endMs: number; firstIndex: number })[] = []
  for (const { opening, index } of sorted) {
    const last = gaps.at(-1)
    const startMs = Date.parse(opening.startUtc)
    const endMs = Date.parse(opening.endUtc)
    if (last && last.key.startsWith(`${pairKey(opening)}@`) && startMs <= last.endMs) {
      last.starts.push(opening)
      if (endMs > last.endMs) { last.endMs = endMs; last.toUtc = opening.endUtc }
      continue
    }
    gaps.push({ key: `${pairKey(opening)}@${opening.startUtc}`, starts: [opening], fromUtc: opening.startUtc, toUtc: opening.endUtc, endMs, firstIndex: index })
  }
  return gaps
    .sort((a, b) => Date.parse(a.fromUtc) - Date.parse(b.fromUtc) || a.firstIndex - b.firstIndex)
    .map(({ key, starts, fromUtc, toUtc }) => ({ key, starts, fromUtc, toUtc }))
}
