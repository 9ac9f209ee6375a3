import type { H3Event } from 'h3'
import { isIP } from 'node:net'

/**
 * The caller's address. X-Forwarded-For is trusted only behind a proxy we configured (NUXT_AUTH_TRUST_PROXY),
 * or anyone could pick their address. Even then only its last entry counts: that is the address our proxy
 * saw; entries before it were written by the client and prove nothing. Anything that is not an IP address
 * falls back to the socket's address, so the value always fits the 64-character columns.
 */
export function clientIp(event: H3Event): string {
  const { auth } = useRuntimeConfig()
  const socketAddress = normalise(event.node.req.socket?.remoteAddress)
  if (!auth.trustProxy) return socketAddress ?? 'unknown'
  const forwarded = String(getRequestHeader(event, 'x-forwarded-for') ?? '').split(',').map((entry) => entry.trim()).filter(Boolean)
  return normalise(forwarded.at(-1)) ?? socketAddress ?? 'unknown'
}

function normalise(address: string | undefined): string | null {
  if (!address) return null
  const plain = address.startsWith('::ffff:') && isIP(address.slice(7)) === 4 ? address.slice(7) : address
  return isIP(plain) && plain.length <= 64 ? plain.toLowerCase() : null
}

/**
 * The address that sign-in limits count against: an IPv4 address as it is, an IPv6 address by its /64
 * network, since one home or office line usually gets a whole /64 and could otherwise rotate through it
 * (RFC 6177 §2 and RFC 7421 §1: a /64 is the usual per-link, per-subscriber assignment).
 */
export function limitKeyOf(address: string): string {
  if (isIP(address) !== 6) return address
  const [head = '', tail = ''] = address.split('::')
  const left = head ? head.split(':') : []
  const right = tail ? tail.split(':') : []
  if (right.at(-1)?.includes('.')) right.splice(-1, 1, '0', '0') // embedded IPv4 tail: two groups
  const groups = address.includes('::') ? [...left, ...Array(Math.max(0, 8 - left.length - right.length)).fill('0'), ...right] : left
  return `${groups.slice(0, 4).map((group) => group.replace(/^0+(?=.)/, '')).join(':')}::/64`
}
