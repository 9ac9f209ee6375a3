import type { Db } from '../utils/db'
import type { MoveOfferState } from '#shared/types/move-offer'

export interface MoveOfferRow {
  id: number
  visit_id: number
  site_id: number
  operatory_id: number
  provider_id: number
  from_start_utc: Date
  start_utc: Date
  end_utc: Date
  nonce: string
  expires_at: Date
  state: MoveOfferState
  created_by: number | null
  created_at: Date
  answered_at: Date | null
}

export type NewMoveOffer = Pick<MoveOfferRow, 'visit_id' | 'site_id' | 'operatory_id' | 'provider_id' | 'from_start_utc' | 'start_utc' | 'end_utc' | 'nonce' | 'expires_at' | 'created_by'>

export async function insertMoveOffer(db: Db, offer: NewMoveOffer): Promise<number> {
  const [id] = await db('move_offers').insert(offer)
  return Number(id)
}

export async function findMoveOffer(db: Db, id: number): Promise<MoveOfferRow | undefined> {
  return (await db('move_offers').where({ id }).first()) as MoveOfferRow | undefined
}

/** Moves an offer from one state to the next; false when it was no longer in `from`. */
export async function setMoveOfferState(db: Db, id: number, from: MoveOfferState, to: MoveOfferState): Promise<boolean> {
  return (await db('move_offers').where({ id, state: from }).update({ state: to, answered_at: new Date() })) > 0
}
