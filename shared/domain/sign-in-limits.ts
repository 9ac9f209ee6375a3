// How sign-in failures are answered (OWASP ASVS 4.0.3 V2.2.1: anti-automation that cannot be turned
// into a denial of service against the account's owner). Pure: the counts come from sign_in_attempts.

export interface SignInLimits {
  /** Failures one address may make against one account in the window before it is refused (429). */
  accountAddressFailureLimit: number
  /** Failures one address may make against all accounts together in the window (429). */
  addressFailureLimit: number
  /** Account failures (from every address) that cost nothing. */
  delayFreeFailures: number
  /** The delay for the first failure past the free ones; it doubles with each failure after that. */
  delayBaseMs: number
  /** The delay never grows beyond this. */
  delayMaxMs: number
}

/**
 * How long an attempt on an account waits before its password is checked, given the account's recent
 * failures from all addresses. It slows guessing without ever refusing: the owner's right password from
 * a clean address still signs in, a few seconds later at worst.
 */
export function signInDelayMs(accountFailures: number, limits: Pick<SignInLimits, 'delayFreeFailures' | 'delayBaseMs' | 'delayMaxMs'>): number {
  const past = Math.floor(accountFailures) - limits.delayFreeFailures
  if (!(past >= 0) || limits.delayBaseMs <= 0 || limits.delayMaxMs <= 0) return 0
  return Math.min(limits.delayMaxMs, limits.delayBaseMs * 2 ** Math.min(past, 30))
}

export type RefusalReason = 'account_and_address' | 'address'

/** Which limit, if any, refuses this attempt before its password is looked at. */
export function refusalFor(counts: { accountAddress: number; address: number }, limits: Pick<SignInLimits, 'accountAddressFailureLimit' | 'addressFailureLimit'>): RefusalReason | null {
  if (counts.accountAddress >= limits.accountAddressFailureLimit) return 'account_and_address'
  if (counts.address >= limits.addressFailureLimit) return 'address'
  return null
}
