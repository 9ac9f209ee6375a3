// How long a failed e-mail waits before the next attempt: exponential backoff with jitter, capped.
export interface RetryPolicy {
  baseSeconds: number
  maxSeconds: number
  maxAttempts: number
}

/** Seconds to wait after `attempts` failed attempts (1 = the first failure); `random` in [0, 1). */
export function retryDelaySeconds(attempts: number, policy: RetryPolicy, random: number): number {
  const exponential = Math.min(policy.maxSeconds, policy.baseSeconds * 2 ** Math.max(0, attempts - 1))
  // "Equal jitter": half the delay fixed, half random, so retries of many messages spread out.
  return exponential / 2 + (exponential / 2) * random
}

export function givesUp(attempts: number, policy: RetryPolicy): boolean {
  return attempts >= policy.maxAttempts
}
