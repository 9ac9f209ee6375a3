// The start-up warning about the patient link address (server/utils/public-url.ts).
import { describe, expect, it } from 'vitest'
import { publicUrlProblem } from '../../../server/utils/public-url'

describe('publicUrlProblem', () => {
  it('warns about loopback addresses (RFC 6890 §2.2.2 127.0.0.0/8, RFC 4291 §2.5.3 ::1; RFC 6761 §6.3 localhost)', () => {
    for (const url of ['http://127.0.0.1:3000', 'https://localhost', 'http://[::1]:3000', 'https://app.localhost', 'http://127.10.0.1']) {
      expect(publicUrlProblem(url)).toMatch(/loopback/)
    }
  })

  it('warns about plain HTTP on a real host (OWASP ASVS 4.0.3 V9.1.1: TLS for all client connectivity)', () => {
    expect(publicUrlProblem('http://visits.fernhollow.test')).toMatch(/plain HTTP/)
  })

  it('accepts an HTTPS address on a real host', () => {
    expect(publicUrlProblem('https://visits.fernhollow.test')).toBeNull()
    expect(publicUrlProblem('https://visits.fernhollow.test:8443/base')).toBeNull()
  })
})
