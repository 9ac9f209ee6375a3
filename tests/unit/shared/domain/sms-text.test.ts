// Texts: the wording (shared/domain/sms-text.ts).
import { describe, expect, it } from 'vitest'
import { moveOfferText, offerText, replyConfirmationText, visitText } from '../../../../shared/domain/sms-text'

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

  it('an offer and a move offer name the site, the times and the link, short and with nothing clinical', () => {
    const offer = { siteName: 'Test Site', when: 'Tue, Jan 12, 9:00 AM', until: 'Mon, Jan 11, 4:00 PM', link: 'http://127.0.0.1/offer/12.abc' }
    const texts = [offerText(offer), moveOfferText({ ...offer, from: 'Fri, Jan 15, 2:00 PM', link: 'http://127.0.0.1/move-offer/12.abc' })]
    for (const text of texts) {
      expect(text).toMatch(/^Test Site: /)
      expect(text).toContain('Tue, Jan 12, 9:00 AM')
      expect(text).toContain('Mon, Jan 11, 4:00 PM')
      expect(text).not.toMatch(CLINICAL)
      expect(text.length).toBeLessThanOrEqual(320)
    }
    expect(texts[0]).toMatch(/first to accept gets it.*http:\/\/127\.0\.0\.1\/offer\/12\.abc$/)
    expect(texts[1]).toContain('Fri, Jan 15, 2:00 PM')
    expect(texts[1]).toMatch(/stays as booked unless you accept.*\/move-offer\/12\.abc$/)
    // A minor's: to the guardian, naming the patient by given name only.
    const guardian = { greeting: 'Rosa Quill', patientFirstName: 'Pip' }
    expect(offerText({ ...offer, guardian })).toContain('Hello Rosa Quill, a dental visit time has come free for Pip')
    expect(moveOfferText({ ...offer, from: 'Fri, Jan 15, 2:00 PM', guardian })).toContain('could Pip\'s visit on Fri, Jan 15, 2:00 PM move to')
  })

  it('answers each reply outcome briefly', () => {
    expect(replyConfirmationText('confirmed', { siteName: 'Test Site', sitePhone: '555-0100', when: 'Mon 11 Jan, 9:00 AM' })).toContain('confirmed')
    expect(replyConfirmationText('opted_out', { siteName: 'Test Site', sitePhone: '555-0100', when: null })).toContain('START')
    expect(replyConfirmationText('opted_in', { siteName: 'Test Site', sitePhone: '555-0100', when: null })).toContain('STOP')
  })

  it('points a reply to an offer text to the offer\'s link, in one short text (160 GSM-7 characters: one segment, 3GPP TS 23.040 §9.2.3.24)', () => {
    const answer = replyConfirmationText('offer_reply', { siteName: 'Fernhollow Dental East', sitePhone: '555-0100', when: null })
    expect(answer).toBe('Fernhollow Dental East: thank you, the front desk has your message. To answer our offer, please use the link in our text.')
    expect(answer.length).toBeLessThanOrEqual(160)
    expect(answer).not.toMatch(/\b(C|YES|X)\b/)
  })
})
