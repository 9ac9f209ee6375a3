// Row locks taken by writing, in one fixed order (operatories by id, then providers by id, then
// the patient), so two bookings never wait on each other crosswise. A write, unlike SELECT … FOR
// UPDATE, is also seen by Galera's certification across nodes.
import type { Db } from '../utils/db'
import { allOf, inOneTrip, writeOnly, type Statement } from './round-trip'

/** The lock writes in their order, to be sent first in a booking's first round trip. */
export function lockStatement(db: Db, operatoryIds: number[], providerIds: number[], patientId: number): Statement<unknown> {
  return allOf([
    ...[...new Set(operatoryIds)].sort((a, b) => a - b).map((id) => writeOnly(db('operatories').where({ id }).increment('booking_seq', 1))),
    ...[...new Set(providerIds)].sort((a, b) => a - b).map((id) => writeOnly(db('providers').where({ id }).increment('booking_seq', 1))),
    writeOnly(db('patients').where({ id: patientId }).update({ updated_at: db.fn.now(3) })),
  ])
}

export async function lockForBooking(db: Db, operatoryIds: number[], providerIds: number[], patientId: number): Promise<void> {
  await inOneTrip(db, [lockStatement(db, operatoryIds, providerIds, patientId)])
}
