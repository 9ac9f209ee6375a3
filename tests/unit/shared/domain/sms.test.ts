// Texts, the pure parts: E.164 numbers, reply keywords, channels per kind, quiet hours, the wording.
import { describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { nationalDigitsOf, toE164 } from '../../../../shared/domain/sms-phone'
import { replyKeywordOf } from '../../../../shared/domain/sms-replies'
import { channelsFor, messageChannelsOf, quietUntilMs } from '../../../../shared/domain/sms-channels'
import { replyConfirmationText, visitText } from '../../../../shared/domain/sms-text'

// Fixed dates on purpose: quietUntilMs is pure and takes its "now".
const LA = 'America/Los_Angeles'
const QUIET = { start: '20:00', end: '08:00' }
const at = (iso: string, zone = LA) => DateTime.fromISO(iso, { zone }).toMillis()
const local = (ms: number, zone = LA) => DateTime.fromMillis(ms, { zone }).toFormat("yyyy-MM-dd'T'HH:mm")

describe('E.164 numbers (ITU-T E.164: + country code and national number, at most 15 digits)', () => {
  it('reads the ways people write a US number', () => {
    for (const written of ['(209) 555-0148', '209-555-0148', '209.555.0148', '+1 209 555 0148', '1 (209) 555-0148']) {
      expect(toE164(written)).toBe('+12095550148')
    }
    expect(nationalDigitsOf('+12095550148')).toBe('2095550148')
  })

  it('reads a number without a country code in the given country', () => {
    expect(toE164('020 7946 0018', 'GB')).toBe('+442079460018')
  })

  it('gives null for what cannot be a number', () => {
    for (const written of [null, undefined, '', '555-01', 'call me', '1'.repeat(41)]) expect(toE164(written)).toBeNull()
  })
})

describe('reply keywords (issue 18 §2; stop words: common carrier practice, no single source)', () => {
  it('C, YES, Y confirm; X, CANCEL, N cancel, in any case with spaces and a full stop', () => {
    for (const body of ['C', 'c', ' yes ', 'Y.', 'Yes!']) expect(replyKeywordOf(body)).toBe('confirm')
    for (const body of ['X', 'x', 'CANCEL', 'cancel', 'N', 'n.']) expect(replyKeywordOf(body)).toBe('cancel')
  })

  it('STOP and the carrier opt-out words opt out; START and UNSTOP opt in', () => {
    for (const body of ['STOP', 'stop', 'STOPALL', 'UNSUBSCRIBE', 'END', 'QUIT']) expect(replyKeywordOf(body)).toBe('stop')
    for (const body of ['START', 'Unstop']) expect(replyKeywordOf(body)).toBe('start')
  })

  it('anything else is no keyword', () => {
    for (const body of ['', 'Can I come at 3 instead?', 'C please', 'yes, see you then', '123', 'STOP IT']) expect(replyKeywordOf(body)).toBeNull()
  })
})

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

describe('wording', () => {
  const facts = { siteName: 'Test Site', sitePhone: '555-0100', when: 'Mon 11 Jan, 9:00 AM', link: 'http://127.0.0.1/visit/abc' }
  const CLINICAL = /filling|composite|tooth|surface|numb|anaesthe|anesthe|extraction|root canal|crown|diagnos/i

  it('each visit text names the site, the time and (except a cancellation) the link, and nothing clinical', () => {
    for (const kind of ['invitation', 'update', 'cancellation', 'reminder'] as const) {
      const text = visitText(kind, facts)
      expect(text).toContain('Test Site')
      expect(text).toContain('Mon 11 Jan, 9:00 AM')
      expect(text).not.toMatch(CLINICAL)
      if (kind !== 'cancellation') expect(text).toContain(facts.link)
      expect(text.length).toBeLessThanOrEqual(320)
    }
  })

  it('answers each reply outcome briefly', () => {
    expect(replyConfirmationText('confirmed', { siteName: 'Test Site', sitePhone: '555-0100', when: 'Mon 11 Jan, 9:00 AM' })).toContain('confirmed')
    expect(replyConfirmationText('opted_out', { siteName: 'Test Site', sitePhone: '555-0100', when: null })).toContain('START')
    expect(replyConfirmationText('opted_in', { siteName: 'Test Site', sitePhone: '555-0100', when: null })).toContain('STOP')
  })
})
