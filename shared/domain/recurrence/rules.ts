// RRULE values as the Rota stores them (RFC 5545 §3.3.10, date parts only): reading one into its
// parts and saying, in plain English, why one cannot be used.
import * as rruleModule from 'rrule'

// Why: rrule ships CommonJS as "main" (what Node and vitest load) and extensionless ESM as
// "module" (what bundlers load). Under Node's ESM loader the named exports sit on `default`.
type RRuleExports = typeof rruleModule
function resolveRRuleExports(): RRuleExports {
  if (typeof rruleModule.RRule === 'function') return rruleModule
  return (rruleModule as unknown as { default: RRuleExports }).default
}
export const { RRule } = resolveRRuleExports()

const SUPPORTED_FREQUENCIES = new Set(['DAILY', 'WEEKLY', 'MONTHLY', 'YEARLY'])
const SUB_DAILY_FREQUENCIES = new Set(['SECONDLY', 'MINUTELY', 'HOURLY'])
const DATE_PART_KEYS = new Set(['FREQ', 'INTERVAL', 'COUNT', 'BYDAY', 'BYMONTHDAY', 'BYMONTH', 'BYSETPOS', 'BYYEARDAY', 'BYWEEKNO', 'WKST'])
export const WEEKDAY_CODES = ['MO', 'TU', 'WE', 'TH', 'FR', 'SA', 'SU'] as const
export type WeekdayCode = (typeof WEEKDAY_CODES)[number]
export const BYDAY_PATTERN = /^([+-]?\d{1,2})?(MO|TU|WE|TH|FR|SA|SU)$/
const INTEGER_LIST_PATTERN = /^[+-]?\d{1,3}(,[+-]?\d{1,3})*$/

export function stripRulePrefix(rrule: string): string {
  return rrule.trim().replace(/^RRULE:/i, '')
}

/** Splits 'FREQ=WEEKLY;BYDAY=MO' into upper-cased key → value; null when malformed or repeated. */
export function ruleParts(rrule: string): Map<string, string> | null {
  const parts = new Map<string, string>()
  for (const piece of stripRulePrefix(rrule).split(';')) {
    const [rawKey, rawValue, extra] = piece.split('=')
    if (!rawKey || rawValue === undefined || rawValue === '' || extra !== undefined) return null
    const key = rawKey.trim().toUpperCase()
    if (parts.has(key)) return null
    parts.set(key, rawValue.trim().toUpperCase())
  }
  return parts
}

function isPositiveInteger(value: string): boolean {
  return /^\d+$/.test(value) && Number(value) > 0
}

function bydayReason(value: string, freq: string): string | null {
  for (const token of value.split(',')) {
    const match = BYDAY_PATTERN.exec(token)
    if (!match) return `"${token}" is not a weekday such as MO or 1MO.`
    // RFC 5545 §3.3.10: numbered weekdays only with MONTHLY or YEARLY.
    if (match[1] !== undefined && freq !== 'MONTHLY' && freq !== 'YEARLY') {
      return 'Numbered weekdays (such as 1MO) need a monthly or yearly rule.'
    }
  }
  return null
}

/** Why a rule cannot be used, in plain English; null when it is fine. */
export function validateRule(rrule: string): string | null {
  if (stripRulePrefix(rrule) === '') return 'The rule is empty.'
  if (/DTSTART/i.test(rrule)) return 'Put the first date in the start date, not DTSTART inside the rule.'
  if (/[\r\n]/.test(rrule)) return 'The rule must be a single RRULE value.'
  const parts = ruleParts(rrule)
  if (!parts) return 'The rule is not a list of NAME=value parts separated by ";", each named once.'
  if (parts.has('COUNT') && parts.has('UNTIL')) return 'A rule may end by COUNT or by UNTIL, not both (RFC 5545 §3.3.10).'
  if (parts.has('UNTIL')) return 'Put the last date in the until date, not UNTIL inside the rule.'
  const freq = parts.get('FREQ')
  if (!freq) return 'The rule needs a FREQ.'
  if (SUB_DAILY_FREQUENCIES.has(freq)) return 'Repeating more often than daily is not supported; a shift sets its own hours.'
  if (!SUPPORTED_FREQUENCIES.has(freq)) return `FREQ=${freq} is not a known frequency.`
  for (const key of parts.keys()) {
    if (key === 'BYHOUR' || key === 'BYMINUTE' || key === 'BYSECOND') {
      return `${key} is not supported; the time of day comes from the start and end times.`
    }
    if (!DATE_PART_KEYS.has(key)) return `${key} is not a supported rule part.`
  }
  for (const key of ['INTERVAL', 'COUNT'] as const) {
    const value = parts.get(key)
    if (value !== undefined && !isPositiveInteger(value)) return `${key} must be a whole number above zero.`
  }
  const byday = parts.get('BYDAY')
  if (byday !== undefined) {
    const reason = bydayReason(byday, freq)
    if (reason) return reason
  }
  for (const key of ['BYMONTHDAY', 'BYMONTH', 'BYSETPOS', 'BYYEARDAY', 'BYWEEKNO'] as const) {
    const value = parts.get(key)
    if (value !== undefined && !INTEGER_LIST_PATTERN.test(value)) return `${key} must be a list of whole numbers.`
  }
  const wkst = parts.get('WKST')
  if (wkst !== undefined && !WEEKDAY_CODES.includes(wkst as WeekdayCode)) return 'WKST must be a weekday such as MO.'
  try {
    RRule.parseString(stripRulePrefix(rrule))
  } catch (error) {
    return `The rule could not be read (${error instanceof Error ? error.message : String(error)}).`
  }
  return null
}
