// Undoing a visit's last state change (shared/domain/visit-undo.ts): the state it returns to, who may
// undo and when (the site's local day the change was made). Fixed dates: the rule is handed "now".
import { describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { mayUndo, undoLabel, undoRetakesTime, undoTarget, UNDO_DESK_ONLY, type UndoFacts } from '../../../../shared/domain/visit-undo'
import { NOT_YOUR_VISIT, type VisitActor } from '../../../../shared/domain/visit-access'

const LA = 'America/Los_Angeles'
const at = (local: string) => DateTime.fromISO(local, { zone: LA }).toMillis()
const iso = (local: string) => DateTime.fromISO(local, { zone: LA }).toUTC().toISO()!
const desk: VisitActor = { role: 'front_desk', allSites: false, siteIds: [1], providerId: null }
const ownDentist: VisitActor = { role: 'dentist', allSites: false, siteIds: [1], providerId: 7 }
const otherDentist: VisitActor = { role: 'dentist', allSites: false, siteIds: [1], providerId: 8 }
const otherDesk: VisitActor = { role: 'front_desk', allSites: false, siteIds: [2], providerId: null }
const visit = (state: UndoFacts['state'], previousState: UndoFacts['previousState'], changedLocal = '2026-12-07T09:05'): UndoFacts => ({
  siteId: 1, providerId: 7, state, previousState, stateChangedAt: iso(changedLocal), timeZone: LA,
})

describe('undo target', () => {
  it('returns to the state before the last change', () => {
    expect(undoTarget(visit('arrived', 'booked'))).toBe('booked')
    expect(undoTarget(visit('arrived', 'confirmed'))).toBe('confirmed')
    expect(undoTarget(visit('treating', 'arrived'))).toBe('arrived')
    expect(undoTarget(visit('finished', 'treating'))).toBe('treating')
    expect(undoTarget(visit('missed', 'booked'))).toBe('booked')
    expect(undoTarget(visit('cancelled', 'confirmed'))).toBe('confirmed')
  })
  it('has nothing to undo without a recorded previous state', () => {
    expect(undoTarget(visit('booked', null))).toBeNull()
  })
  it('knows which undos take the chair and provider back', () => {
    expect(undoRetakesTime(visit('missed', 'booked'))).toBe(true)
    expect(undoRetakesTime(visit('cancelled', 'arrived'))).toBe(true)
    expect(undoRetakesTime(visit('finished', 'treating'))).toBe(false)
  })
  it('names the change in the button', () => {
    expect(undoLabel('missed')).toBe('Undo did not come')
    expect(undoLabel('treating')).toBe('Undo in treatment')
  })
})

describe('who may undo, and when', () => {
  const now = at('2026-12-07T09:30')
  it('lets the desk and the visit\'s own provider undo on the day of the change', () => {
    expect(mayUndo(desk, visit('arrived', 'booked'), now)).toEqual({ allowed: true })
    expect(mayUndo(ownDentist, visit('finished', 'treating'), now)).toEqual({ allowed: true })
  })
  it('refuses another provider and another site\'s desk (403)', () => {
    expect(mayUndo(otherDentist, visit('arrived', 'booked'), now)).toEqual({ allowed: false, status: 403, reason: NOT_YOUR_VISIT })
    expect(mayUndo(otherDesk, visit('arrived', 'booked'), now)).toMatchObject({ allowed: false, status: 403 })
  })
  it('leaves undoing a cancellation to the desk, as cancelling is', () => {
    expect(mayUndo(ownDentist, visit('cancelled', 'booked'), now)).toEqual({ allowed: false, status: 403, reason: UNDO_DESK_ONLY })
    expect(mayUndo(desk, visit('cancelled', 'booked'), now)).toEqual({ allowed: true })
  })
  it('refuses on a later local day, even when UTC has not turned', () => {
    // 23:50 on the 7th in Los Angeles is the 8th in UTC; 00:10 on the 8th is a new local day.
    expect(mayUndo(desk, visit('arrived', 'booked', '2026-12-07T08:00'), at('2026-12-07T23:50')).allowed).toBe(true)
    expect(mayUndo(desk, visit('arrived', 'booked', '2026-12-07T23:50'), at('2026-12-08T00:10'))).toMatchObject({ allowed: false, status: 409 })
  })
  it('refuses when there is nothing to undo (409)', () => {
    expect(mayUndo(desk, visit('booked', null), now)).toMatchObject({ allowed: false, status: 409, reason: 'There is no state change to undo on this visit.' })
  })
})
