// Patient e-mails waiting to be sent. Rows are written inside the booking transaction.
import type { Db } from '../utils/db'

export type OutboxKind = 'invitation' | 'update' | 'cancellation' | 'reminder'

export async function enqueueMessage(db: Db, message: { kind: OutboxKind; appointmentId: number; siteId: number; dueAt: Date; payload: Record<string, unknown> }): Promise<void> {
  await db('outbox').insert({
    kind: message.kind, appointment_id: message.appointmentId, site_id: message.siteId,
    due_at: message.dueAt, payload: JSON.stringify(message.payload),
  })
}
