// Patients open the links in their e-mails at NUXT_MAIL_PUBLIC_URL. On a server in production that
// address must be one they can reach, over HTTPS: a loopback host reaches nobody, and plain HTTP sends
// the signed links in the clear (OWASP ASVS 4.0.3 V9.1.1).
const LOOPBACK = /^(?:localhost|127(?:\.\d{1,3}){3}|\[::1\]|0\.0\.0\.0|\[::\])$/i

/** Why this public address will not serve patients, or null when it looks right. */
export function publicUrlProblem(publicUrl: string): string | null {
  let url: URL
  try {
    url = new URL(publicUrl)
  } catch {
    return `NUXT_MAIL_PUBLIC_URL is not an address (${JSON.stringify(publicUrl)})`
  }
  const host = url.hostname
  if (LOOPBACK.test(host) || host.endsWith('.localhost')) return `NUXT_MAIL_PUBLIC_URL is ${url.origin}, a loopback address: links in patient e-mails will not open for anyone; set it to the address patients reach this server at`
  if (url.protocol !== 'https:') return `NUXT_MAIL_PUBLIC_URL is ${url.origin}, plain HTTP: links in patient e-mails travel unencrypted; use https://`
  return null
}
