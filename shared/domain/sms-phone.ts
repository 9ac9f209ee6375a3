// A patient's phone number as the SMS service wants it: E.164 (+<country><number>), or null when it
// cannot be one. libphonenumber-js reads the many ways people write numbers ("(209) 555-0148",
// "209.555.0148", "+1 209 555 0148"); a number without a country code is read in `defaultCountry`.
import { parsePhoneNumberFromString, type CountryCode } from 'libphonenumber-js'

export const DEFAULT_SMS_COUNTRY: CountryCode = 'US'

export function toE164(phone: string | null | undefined, defaultCountry: CountryCode = DEFAULT_SMS_COUNTRY): string | null {
  if (!phone || phone.length > 40) return null
  const parsed = parsePhoneNumberFromString(phone, defaultCountry)
  return parsed && parsed.isPossible() ? parsed.number : null
}

/** The digits a stored number must end with to be this E.164 number (its national number). */
export function nationalDigitsOf(e164: string): string | null {
  const parsed = parsePhoneNumberFromString(e164)
  return parsed ? parsed.nationalNumber : null
}
