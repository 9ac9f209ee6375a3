// When a visit's reminder e-mails go out: per-site offsets before the start, never inside the
// site's local quiet hours (a reminder that would fall there goes out earlier, before quiet hours
// begin), never in the past, one per moment.
import { addDays, localDateAt, localTime, localToUtcMs, minutesOfDay } from '../utils/local-date'

export interface QuietHours {
  /** Local 'HH:MM'; quiet from start (inclusive) to end (exclusive), may wrap past midnight. */
  start: string
  end: string
}

export interface ReminderPlanInput {
  startMs: number
  offsetsHours: readonly number[]
  quietHours: QuietHours | null
  timeZone: string
  nowMs: number
}

export interface PlannedReminder {
  offsetHours: number
  dueMs: number
}

/** How long before quiet hours begin a moved reminder is sent. */
export const BEFORE_QUIET_MINUTES = 15

export function isQuiet(localMinutes: number, quiet: QuietHours): boolean {
  const start = minutesOfDay(quiet.start)
  const end = minutesOfDay(quiet.end)
  if (start === end) return false
  return start < end ? localMinutes >= start && localMinutes < end : localMinutes >= start || localMinutes < end
}

/** The instant a reminder due at `dueMs` is actually sent: before the quiet hours it falls in. */
export function outsideQuietHours(dueMs: number, quiet: QuietHours | null, timeZone: string): number {
  if (!quiet) return dueMs
  const minutes = minutesOfDay(localTime(new Date(dueMs).toISOString(), timeZone))
  if (!isQuiet(minutes, quiet)) return dueMs
  const today = localDateAt(dueMs, timeZone)
  // Quiet hours that began yesterday evening (we are in the early morning part of them).
  const day = minutes >= minutesOfDay(quiet.start) ? today : addDays(today, -1)
  return localToUtcMs(day, quiet.start, timeZone) - BEFORE_QUIET_MINUTES * 60_000
}

export function planReminders(input: ReminderPlanInput): PlannedReminder[] {
  const planned: PlannedReminder[] = []
  const offsets = [...new Set(input.offsetsHours.filter((hours) => Number.isFinite(hours) && hours > 0))].sort((a, b) => b - a)
  for (const offsetHours of offsets) {
    const dueMs = outsideQuietHours(input.startMs - offsetHours * 3_600_000, input.quietHours, input.timeZone)
    if (dueMs <= input.nowMs || dueMs >= input.startMs) continue
    if (planned.some((other) => other.dueMs === dueMs)) continue
    planned.push({ offsetHours, dueMs })
  }
  return planned
}
