// Texts: the wording (shared/domain/sms-text.ts).
import { describe, expect, it } from 'vitest'
import { replyConfirmationText, visitText } from '../../../../shared/domain/sms-text'

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
