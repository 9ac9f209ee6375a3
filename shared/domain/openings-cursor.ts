// Walking grid starts in time order: one cursor per (chair, provider) pair over its start
// windows, and a k-way merge of all cursors so the search can stop after the first N.
import type { PartOfDay } from '../types/openings'
import { isInPartOfDay, nextGridStart } from './openings-grid'
import type { StartWindow } from './openings-windows'

/** A chair and a provider at one site, with the starts where every rule holds. */
export interface Pairing {
  siteId: number
  operatoryId: number
  providerId: number
  timeZone: string
  unitMinutes: number
  windows: StartWindow[]
  /** Position among pairings for equally early starts (lower first). */
  rank: number
}

/** Yields a pairing's grid starts inside its windows, earliest first. */
export class StartCursor {
  /** The start the cursor stands on; null once the windows are used up. */
  current: number | null = null
  private windowIndex = 0
  private fromMs = -Infinity

  constructor(
    readonly pairing: Pairing,
    private readonly partOfDay: PartOfDay,
  ) {
    this.advance()
  }

  advance(): void {
    const { windows, timeZone, unitMinutes } = this.pairing
    while (this.windowIndex < windows.length) {
      const window = windows[this.windowIndex]!
      const start = nextGridStart(Math.max(this.fromMs, window.firstMs), timeZone, unitMinutes)
      if (start > window.lastMs) {
        this.windowIndex++
        continue
      }
      this.fromMs = start + 1
      if (isInPartOfDay(start, timeZone, this.partOfDay)) {
        this.current = start
        return
      }
    }
    this.current = null
  }
}

function isBefore(a: StartCursor, b: StartCursor): boolean {
  // Only cursors with a current start are ever in the heap.
  return a.current! < b.current! || (a.current === b.current && a.pairing.rank < b.pairing.rank)
}

/** A binary min-heap of cursors by (current start, rank). */
class CursorHeap {
  private readonly items: StartCursor[] = []

  get size(): number {
    return this.items.length
  }

  push(cursor: StartCursor): void {
    const items = this.items
    items.push(cursor)
    let i = items.length - 1
    while (i > 0) {
      const parent = (i - 1) >> 1
      if (!isBefore(items[i]!, items[parent]!)) break
      ;[items[i], items[parent]] = [items[parent]!, items[i]!]
      i = parent
    }
  }

  /** Re-places the top after its cursor moved on (or drops it when finished). */
  fixTop(): void {
    const items = this.items
    const top = items[0]!
    if (top.current === null) {
      const last = items.pop()!
      if (items.length === 0) return
      items[0] = last
    }
    this.siftDown(0)
  }

  peek(): StartCursor | undefined {
    return this.items[0]
  }

  private siftDown(from: number): void {
    const items = this.items
    let i = from
    for (;;) {
      const left = 2 * i + 1
      const right = left + 1
      let best = i
      if (left < items.length && isBefore(items[left]!, items[best]!)) best = left
      if (right < items.length && isBefore(items[right]!, items[best]!)) best = right
      if (best === i) return
      ;[items[i], items[best]] = [items[best]!, items[i]!]
      i = best
    }
  }
}

export interface TimedStart {
  pairing: Pairing
  startMs: number
}

/**
 * Calls `take` for every grid start of every pairing in (start, rank) order, until it returns
 * false or the starts run out.
 */
export function walkStartsInOrder(pairings: readonly Pairing[], partOfDay: PartOfDay, take: (start: TimedStart) => boolean): void {
  const heap = new CursorHeap()
  for (const pairing of pairings) {
    const cursor = new StartCursor(pairing, partOfDay)
    if (cursor.current !== null) heap.push(cursor)
  }
  while (heap.size > 0) {
    const cursor = heap.peek()!
    if (!take({ pairing: cursor.pairing, startMs: cursor.current! })) return
    cursor.advance()
    heap.fixTop()
  }
}
