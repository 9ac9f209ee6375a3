// Reminder rows for a visit, planned when it is booked or moved (booking-service calls these inside
// its transaction). The dispatcher checks again at send time that the visit still starts then.
import type { Db } from '../../utils/db'
import { planReminders } from '#shared/domain/reminders'
import { holdsTime } from '#shared/domain/visit-states'
import { enqueueMessage, skipQueuedReminders } from '../../repositories/outbox'
import { loadMailContext } from '../../repositories/mail-context'
import { mailSettingsOf } from './mail-settings'

export async function dropQueuedReminders(db: Db, appointmentId: number): Promise<void> {
  await skipQueuedReminders(db, appointmentId, 'visit moved or cancelled: reminders planned again')
}

export async function queueReminders(db: Db, appointmentId: number, nowMs = Date.now()): Promise<number> {
  const context = await loadMailContext(db, appointmentId)
  if (!context || !holdsTime(context.visit.state)) return 0
  if (!context.patient.email || !context.patient.emailConsent) return 0
  const settings = mailSettingsOf(context.site.settings)
  const planned = planReminders({
    startMs: context.visit.startUtc.getTime(), offsetsHours: settings.reminderOffsetsHours,
    quietHours: settings.quietHours, timeZone: context.site.timeZone, nowMs,
  })
  for (const reminder of planned) {
    await enqueueMessage(db, {
      kind: 'reminder', appointmentId, siteId: context.site.id, dueAt: new Date(reminder.dueMs),
      payload: { appointmentId, startUtc: context.visit.startUtc.toISOString(), offsetHours: reminder.offsetHours },
    })
  }
  return planned.length
}
