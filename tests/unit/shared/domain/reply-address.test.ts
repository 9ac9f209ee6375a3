// Each site's calendar reply address (shared/domain/reply-address.ts): the ORGANIZER patients' calendars
// answer to (RFC 5546 §3.2.3 REPLY), read back to the site on the inbound endpoint.
import { describe, expect, it } from 'vitest'
import { isReplyTemplate, replyAddressOf, siteOfReplyAddress } from '../../../../shared/domain/reply-address'

describe('reply addresses', () => {
  it('put the site id into the template and read it back', () => {
    expect(replyAddressOf('replies+{site}@cuspline.test', 42)).toBe('replies+42@cuspline.test')
    expect(siteOfReplyAddress('replies+{site}@cuspline.test', 'Replies+42@Cuspline.test')).toBe(42)
    expect(siteOfReplyAddress('replies+{site}@cuspline.test', 'replies+x@cuspline.test')).toBeNull()
    expect(siteOfReplyAddress('replies+{site}@cuspline.test', 'other+42@cuspline.test')).toBeNull()
    expect(isReplyTemplate('')).toBe(false)
    expect(isReplyTemplate('replies@{site}.test')).toBe(false)
    expect(replyAddressOf('', 1)).toBeNull()
  })

  it('refuse templates without exactly one {site} in the local part, and ids out of range', () => {
    expect(isReplyTemplate('replies+{site}+{site}@cuspline.test')).toBe(false)
    expect(isReplyTemplate('replies@cuspline.test')).toBe(false)
    expect(isReplyTemplate('replies {site}@cuspline.test')).toBe(false)
    expect(replyAddressOf('replies@{site}.test', 3)).toBeNull()
    expect(siteOfReplyAddress('replies+{site}@cuspline.test', 'replies+0@cuspline.test')).toBeNull()
    expect(siteOfReplyAddress('replies+{site}@cuspline.test', 'replies+2147483648@cuspline.test')).toBeNull()
    expect(siteOfReplyAddress('replies+{site}@cuspline.test', '  replies+7@cuspline.test ')).toBe(7)
    // Dots in the template are literal, not "any character".
    expect(siteOfReplyAddress('replies+{site}@cuspline.test', 'replies+7@cusplineXtest')).toBeNull()
  })
})
