// The booking path's idea of "now" (minimum notice, openings, reminder planning).
// NUXT_SCHEDULE_CLOCK_OFFSET_MINUTES moves it, for one use only: the demo seeder books last week's
// visits through the real booking service on a private server whose clock reads a week earlier
// (scripts/seed-demo-visits.ts). It stays 0 everywhere else; the server warns when it is not.
import { useLogger } from './logger'

let offsetMs: number | undefined

export function scheduleNowMs(): number {
  if (offsetMs === undefined) {
    const minutes = Number(useRuntimeConfig().scheduleClockOffsetMinutes) || 0
    offsetMs = minutes * 60_000
    if (offsetMs !== 0) useLogger('clock').warn(`the booking clock is moved by ${minutes} minutes (demo seeding only)`)
  }
  return Date.now() + offsetMs
}
