// Each site's calendar reply address (the ORGANIZER of its events): a template with `{site}` for the
// site's id, e.g. `replies+{site}@cuspline.test`. Patients' calendars send their iTIP REPLY there
// (RFC 5546 §3.2.3); the inbound endpoint reads the site back from the address. Pure.

/** The site's reply address, or null when the template is empty or malformed (then the site's own e-mail is used). */
export function replyAddressOf(template: string, siteId: number): string | null {
  if (!isReplyTemplate(template)) return null
  return template.replace('{site}', String(siteId))
}

/** A usable template: one `{site}` in the local part of one address. */
export function isReplyTemplate(template: string): boolean {
  const at = template.lastIndexOf('@')
  return at > 0 && template.split('{site}').length === 2 && template.indexOf('{site}') < at && /^[^\s@<>"]+@[A-Za-z0-9.-]+$/.test(template)
}

/** The site id a reply address names, or null when it is not one of ours. */
export function siteOfReplyAddress(template: string, address: string): number | null {
  if (!isReplyTemplate(template)) return null
  const [before, after] = template.split('{site}') as [string, string]
  const quote = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')
  const match = new RegExp(`^${quote(before)}(\\d{1,10})${quote(after)}$`, 'i').exec(address.trim())
  if (!match) return null
  const id = Number(match[1])
  return Number.isSafeInteger(id) && id >= 1 && id <= 2_147_483_647 ? id : null
}
