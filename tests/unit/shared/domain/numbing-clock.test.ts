// The numbing clock (shared/domain/numbing-clock.ts): it runs from "anaesthetic given", never from the
// plan. Onset minutes are the template's practice defaults (common practice, no source); fixed dates:
// the rule is handed "now".
import { describe, expect, it } from 'vitest'
import type { PlannedAnaesthesia } from '../../../../shared/types/chair-time'
import { mayGiveAnaesthetic, numbingStatus, plannedOnsetText, ONSET_CAUTION, type NumbingFacts } from '../../../../shared/domain/numbing-clock'

const injection = (onsetMinutes: number): PlannedAnaesthesia => ({
  quadrant: 1, arch: 'maxillary', technique: 'infiltration', injectMinutes: 2, onsetMinutes, injectAt: 5, readyAt: 7 + onsetMinutes,
})
const facts = (state: NumbingFacts['state'], anaestheticGivenAt: string | null, onsets = [5]): NumbingFacts => ({
  state, anaestheticGivenAt, plan: { anaesthesia: onsets.map(injection) },
})
const given = '2026-12-07T17:12:00Z'
const after = (minutes: number) => Date.parse(given) + minutes * 60_000

describe('numbing clock', () => {
  it('shows nothing for a patient who has not arrived, even in the planned numbing time', () => {
    expect(numbingStatus(facts('booked', null), after(0))).toBeNull()
    expect(numbingStatus(facts('confirmed', null), after(0))).toBeNull()
  })
  it('shows the planned onset in words, not a clock, until the anaesthetic is given', () => {
    expect(numbingStatus(facts('arrived', null), after(0))).toEqual({ kind: 'planned', onsetMinutes: 5 })
    expect(plannedOnsetText(5)).toBe('numbing about 5 min after the injection')
  })
  it('counts down from the injection for the onset minutes, then says ready', () => {
    expect(numbingStatus(facts('arrived', given), after(2))).toEqual({ kind: 'counting', readyAtMs: after(5), msLeft: 3 * 60_000 })
    expect(numbingStatus(facts('treating', given), after(5))).toEqual({ kind: 'ready', readyAtMs: after(5) })
  })
  it('waits for the slowest of several injections', () => {
    expect(numbingStatus(facts('arrived', given, [3, 8]), after(4))).toMatchObject({ kind: 'counting', readyAtMs: after(8) })
  })
  it('offers "anaesthetic given" only for a visit with numbing whose patient is in the chair', () => {
    expect(mayGiveAnaesthetic(facts('arrived', null))).toBe(true)
    expect(mayGiveAnaesthetic(facts('treating', null))).toBe(true)
    expect(mayGiveAnaesthetic(facts('booked', null))).toBe(false)
    expect(mayGiveAnaesthetic(facts('finished', null))).toBe(false)
    expect(mayGiveAnaesthetic(facts('arrived', null, []))).toBe(false)
    expect(numbingStatus(facts('arrived', null, []), after(0))).toBeNull()
  })
  it('carries the clinical caution', () => {
    expect(ONSET_CAUTION).toMatch(/treating clinician confirms anaesthesia/)
  })
})
