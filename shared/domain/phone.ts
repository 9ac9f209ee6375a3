// Phone numbers: stored in E.164 (`+12095550177`), typed in national or international form, shown in
// the national form. libphonenumber-js holds the numbering plans; the default country is where a
// number without its country code is read (the group's sites are all in one country today).
import { parsePhoneNumberFromString, type CountryCode } from 'libphonenumber-js'

export const DEFAULT_PHONE_COUNTRY: CountryCode = 'US'

/** The E.164 form of a phone number typed in any common way, or null when it is not a real number. */
export function toE164(text: string, country: CountryCode = DEFAULT_PHONE_COUNTRY): string | null {
  const parsed = parsePhoneNumberFromString(text.trim(), country)
  return parsed?.isValid() ? parsed.number : null
}

/** "(209) 555-0177" for a number of the default country, the international form for any other. */
export function formatPhone(e164: string | null, country: CountryCode = DEFAULT_PHONE_COUNTRY): string {
  if (!e164) return ''
  const parsed = parsePhoneNumberFromString(e164)
  if (!parsed) return e164
  return parsed.country === country ? parsed.formatNational() : parsed.formatInternational()
}
