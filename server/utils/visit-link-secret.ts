// The HMAC secret of patient links, from runtime config (generated into .data/ by scripts/lib/env.sh).
export function useVisitLinkSecret(): string {
  const secret = String(useRuntimeConfig().mail.linkSecret || '')
  if (secret.length < 32) {
    throw new Error('Patient link secret missing or short: set NUXT_MAIL_LINK_SECRET (at least 32 characters; scripts/lib/env.sh generates one).')
  }
  return secret
}
