// Database-wide double-booking checks: pairs of segments that share a chair, pairs of hands-on
// segments that share a provider, and pairs of live visits that share a patient, overlapping in time.
import type { Knex } from 'knex'

export interface OverlapCounts {
  chairs: number
  handsOn: number
  patients: number
}

async function count(db: Knex, sql: string): Promise<number> {
  const [rows] = await db.raw(sql)
  return Number(rows[0].n)
}

export async function overlapCounts(db: Knex): Promise<OverlapCounts> {
  const chairs = await count(db, `SELECT COUNT(*) AS n FROM visit_segments x JOIN visit_segments y
    ON x.operatory_id = y.operatory_id AND x.visit_id < y.visit_id AND x.start_utc < y.end_utc AND x.end_utc > y.start_utc`)
  const handsOn = await count(db, `SELECT COUNT(*) AS n FROM visit_segments x JOIN visit_segments y
    ON x.provider_id = y.provider_id AND x.visit_id < y.visit_id AND x.kind = 'hands_on' AND y.kind = 'hands_on'
    AND x.start_utc < y.end_utc AND x.end_utc > y.start_utc`)
  const patients = await count(db, `SELECT COUNT(*) AS n FROM visits x JOIN visits y
    ON x.patient_id = y.patient_id AND x.id < y.id AND x.start_utc < y.end_utc AND x.end_utc > y.start_utc
    WHERE x.state <> 'cancelled' AND y.state <> 'cancelled'`)
  return { chairs, handsOn, patients }
}
