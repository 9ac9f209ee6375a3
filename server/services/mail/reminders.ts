// Reminder rows for a visit, planned when it is booked or moved (booking-service calls these inside
// its transaction). The dispatcher checks again at send time that the visit still starts then.
import type { Db } from '../../utils/db'
import { planReminders } from '#shared/domain/reminders'
import { skipQueuedReminders, type NewOutboxMessage } from '../../repositories/outbox'
import { mailSettingsOf } from '#shared/domain/site-settings'
import { scheduleNowMs } from '../../utils/clock'

export async function dropQueuedReminders(db: Db, visitId: number): Promise<void> {
  await skipQueuedReminders(db, visitId, 'visit moved or cancelled: reminders planned again')
}

export interface ReminderVisit {
  visitId: number
  startMs: number
  site: { id: number; timeZone: string; settings: Record<string, unknown> }
}

/** The outbox rows of a visit's reminders under the site's offsets and quiet hours. */
export function reminderMessages(visit: ReminderVisit, nowMs = scheduleNowMs()): NewOutboxMessage[] {
  const settings = mailSettingsOf(visit.site.settings)
  const planned = planReminders({
    startMs: visit.startMs, offsetsHours: settings.reminderOffsetsHours,
    quietHours: settings.quietHours, timeZone: visit.site.timeZone, nowMs,
  })
  return planned.map((reminder) => ({
    kind: 'reminder', visitId: visit.visitId, siteId: visit.site.id, dueAt: new Date(reminder.dueMs),
    payload: { visitId: visit.visitId, startUtc: new Date(visit.startMs).toISOString(), offsetHours: reminder.offsetHours },
  }))
}
