// Texts: the keywords a patient's reply may carry (shared/domain/sms-replies.ts).
import { describe, expect, it } from 'vitest'
import { replyKeywordOf } from '../../../../shared/domain/sms-replies'

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
