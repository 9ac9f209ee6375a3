// Row locks taken by writing, in one fixed order (operatories by id, then providers by id, then
// the patient), so two bookings never wait on each other crosswise. A write, unlike SELECT … FOR
// UPDATE, is also seen by Galera's certification across nodes.
import type { Db } from '../utils/db'

export async function lockForBooking(db: Db, operatoryIds: number[], providerIds: number[], patientId: number): Promise<void> {
  for (const id of [...new Set(operatoryIds)].sort((a, b) => a - b)) {
    await db('operatories').where({ id }).increment('booking_seq', 1)
  }
  for (const id of [...new Set(providerIds)].sort((a, b) => a - b)) {
    await db('providers').where({ id }).increment('booking_seq', 1)
  }
  await db('patients').where({ id: patientId }).update({ updated_at: db.fn.now(3) })
}
