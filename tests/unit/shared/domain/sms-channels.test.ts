// Texts: channels per message kind and quiet hours (shared/domain/sms-channels.ts).
import { describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { channelsFor, channelsWithReason, channelWords, messageChannelsOf, quietUntilMs, reachOn, type ReachPatient } from '../../../../shared/domain/sms-channels'

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

describe('offers: e-mail and text as the patient can be reached', () => {
  // Fixed dates on purpose: reachOn is pure and takes the date the message is about.
  const ADULT: ReachPatient = {
    firstName: 'Wren', lastName: 'Tally', dateOfBirth: '1980-02-03', email: 'wren@example.test', phone: '(209) 555-0148',
    guardianName: null, guardianEmail: null, guardianPhone: null, emailConsent: true, smsConsent: true, smsOptedOutAt: null,
  }
  const CHILD: ReachPatient = { ...ADULT, firstName: 'Pip', dateOfBirth: '2020-05-01', guardianName: 'Rosa Quill', guardianEmail: 'rosa@example.test', guardianPhone: '(209) 555-0149' }

  it('go by e-mail and text by default, to whatever the patient agreed to', () => {
    expect(channelsFor('offer', {}, { email: true, sms: true })).toEqual(['email', 'sms'])
    expect(channelsFor('move_offer', {}, { email: true, sms: true })).toEqual(['email', 'sms'])
    expect(channelsWithReason('offer', {}, reachOn(ADULT, '2027-01-11', 'US'))).toEqual({ channels: ['email', 'sms'], why: null })
    expect(channelsWithReason('offer', {}, reachOn({ ...ADULT, smsConsent: false }, '2027-01-11', 'US')).channels).toEqual(['email'])
    expect(channelsWithReason('move_offer', {}, reachOn({ ...ADULT, emailConsent: false }, '2027-01-11', 'US')).channels).toEqual(['sms'])
    // A site that sends offers by e-mail only.
    expect(channelsWithReason('offer', { messageChannels: { offer: ['email'] } }, reachOn(ADULT, '2027-01-11', 'US')).channels).toEqual(['email'])
  })

  it('a minor is reached only through the guardian; without their contact, not at all, and the reason says so', () => {
    expect(reachOn(CHILD, '2027-01-11', 'US')).toEqual({ email: true, sms: true })
    const noGuardian = reachOn({ ...CHILD, guardianEmail: null, guardianPhone: null }, '2027-01-11', 'US')
    expect(noGuardian.email).toMatch(/no guardian e-mail address is on file: not sent to the child/)
    expect(noGuardian.sms).toMatch(/no guardian mobile number is on file: not sent to the child/)
    const none = channelsWithReason('offer', {}, noGuardian)
    expect(none.channels).toEqual([])
    expect(none.why).toMatch(/^no e-mail or text can reach them: .*e-mail address.*; .*mobile number/)
  })

  it('names what stops each channel: consent, STOP, a number that cannot take texts', () => {
    expect(reachOn({ ...ADULT, emailConsent: false, smsConsent: false }, '2027-01-11', 'US')).toEqual({ email: 'the patient has not agreed to e-mail', sms: 'the patient has not agreed to texts' })
    expect(reachOn({ ...ADULT, smsOptedOutAt: new Date('2026-01-01T00:00:00Z') }, '2027-01-11', 'US').sms).toBe('the patient replied STOP to texts')
    expect(reachOn({ ...ADULT, phone: '12' }, '2027-01-11', 'US').sms).toBe('the patient\'s number cannot take texts')
    expect(channelsWithReason('offer', { messageChannels: { offer: [] } }, reachOn(ADULT, '2027-01-11', 'US')).why).toBe('the site sends this message by neither e-mail nor text')
  })

  it('reads the channels in words', () => {
    expect(channelWords(['email', 'sms'])).toBe('e-mail and text')
    expect(channelWords(['sms'])).toBe('text')
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
