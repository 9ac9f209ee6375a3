// Texts: channels per message kind and quiet hours (shared/domain/sms-channels.ts).
import { describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { channelsFor, messageChannelsOf, quietUntilMs } from '../../../../shared/domain/sms-channels'

// Fixed dates on purpose: quietUntilMs is pure and takes its "now".
const LA = 'America/Los_Angeles'
const QUIET = { start: '20:00', end: '08:00' }
const at = (iso: string, zone = LA) => DateTime.fromISO(iso, { zone }).toMillis()
const local = (ms: number, zone = LA) => DateTime.fromMillis(ms, { zone }).toFormat("yyyy-MM-dd'T'HH:mm")

describe('channels per message kind', () => {
  it('defaults to e-mail, and a text as well for reminders', () => {
    const both = { email: true, sms: true }
    expect(channelsFor('invitation', {}, both)).toEqual(['email'])
    expect(channelsFor('reminder', {}, both)).toEqual(['email', 'sms'])
    expect(channelsFor('reminder', {}, { email: false, sms: true })).toEqual(['sms'])
    expect(channelsFor('reminder', {}, { email: true, sms: false })).toEqual(['email'])
  })

  it('follows the site setting, ignoring unknown channels', () => {
    const settings = { messageChannels: { invitation: ['sms', 'fax'], cancellation: [] } }
    expect(messageChannelsOf(settings)).toMatchObject({ invitation: ['sms'], cancellation: [], update: ['email'] })
    expect(channelsFor('invitation', settings, { email: true, sms: false })).toEqual([])
  })
})

describe('quiet hours for texts', () => {
  it('outside quiet hours a text goes now', () => {
    expect(quietUntilMs(at('2026-03-10T12:00'), QUIET, LA)).toBeNull()
    expect(quietUntilMs(at('2026-03-10T22:00'), null, LA)).toBeNull()
  })

  it('in the evening it waits until the next morning; after midnight until that morning', () => {
    expect(local(quietUntilMs(at('2026-03-10T21:30'), QUIET, LA)!)).toBe('2026-03-11T08:00')
    expect(local(quietUntilMs(at('2026-03-11T03:00'), QUIET, LA)!)).toBe('2026-03-11T08:00')
  })

  it('quiet hours inside one day end that day', () => {
    expect(local(quietUntilMs(at('2026-03-10T12:30'), { start: '12:00', end: '13:00' }, LA)!)).toBe('2026-03-10T13:00')
  })

  it('across the spring change of clocks the morning is still 08:00 local (IANA tz: 8 March 2026)', () => {
    expect(local(quietUntilMs(at('2026-03-07T23:00'), QUIET, LA)!)).toBe('2026-03-08T08:00')
  })
})
