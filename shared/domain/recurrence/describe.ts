// Describing a rule in plain English: "every Monday and Wednesday", "the first Monday of each month".
import { BYDAY_PATTERN, RRule, WEEKDAY_CODES, ruleParts, stripRulePrefix, validateRule, type WeekdayCode } from './rules'

const WEEKDAY_NAMES: Record<WeekdayCode, string> = {
  MO: 'Monday',
  TU: 'Tuesday',
  WE: 'Wednesday',
  TH: 'Thursday',
  FR: 'Friday',
  SA: 'Saturday',
  SU: 'Sunday',
}

const ORDINAL_WORDS: Record<string, string> = {
  '1': 'first',
  '2': 'second',
  '3': 'third',
  '4': 'fourth',
  '5': 'fifth',
  '-1': 'last',
  '-2': 'second to last',
  '-3': 'third to last',
  '-4': 'fourth to last',
  '-5': 'fifth to last',
}

function joinWithAnd(words: readonly string[]): string {
  if (words.length <= 1) return words.join('')
  return `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`
}

/** 'every', 'every other', 'every 3 weeks on' style lead-ins. */
function everyPhrase(interval: number, unitPlural: string): string {
  if (interval === 1) return 'every'
  if (interval === 2) return 'every other'
  return `every ${interval} ${unitPlural} on`
}

function dayOfMonthWord(value: string): string {
  const n = Number(value)
  if (n === -1) return 'last day'
  if (n < 0) return `${ORDINAL_WORDS[String(n)] ?? `${-n}th to last`} day`
  const lastTwo = n % 100
  const suffix = lastTwo >= 11 && lastTwo <= 13 ? 'th' : ({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[n % 10] ?? 'th'
  return `${n}${suffix}`
}

function monthSpan(interval: number): string {
  if (interval === 1) return 'each month'
  if (interval === 2) return 'every other month'
  return `every ${interval} months`
}

function describeWeekly(days: WeekdayCode[], interval: number): string {
  if (days.length === 0) return interval === 1 ? 'every week' : interval === 2 ? 'every other week' : `every ${interval} weeks`
  const isWorkweek = days.length === 5 && ['MO', 'TU', 'WE', 'TH', 'FR'].every((d) => days.includes(d as WeekdayCode))
  const list = isWorkweek ? 'weekday' : joinWithAnd(days.map((d) => WEEKDAY_NAMES[d]))
  return `${everyPhrase(interval, 'weeks')} ${list}`
}

function describeMonthly(parts: Map<string, string>, interval: number): string | null {
  const byday = parts.get('BYDAY')
  const bymonthday = parts.get('BYMONTHDAY')
  if (byday && !bymonthday) {
    const tokens = byday.split(',').map((t) => BYDAY_PATTERN.exec(t))
    const weekdays = new Set(tokens.map((m) => m?.[2]))
    const nths = tokens.map((m) => m?.[1])
    // Only "the first and third Monday" shapes read well; the rest falls back.
    if (weekdays.size !== 1 || nths.some((n) => n === undefined || !ORDINAL_WORDS[String(Number(n))])) return null
    const weekday = WEEKDAY_NAMES[[...weekdays][0] as WeekdayCode]
    const ordinals = joinWithAnd(nths.map((n) => ORDINAL_WORDS[String(Number(n))] ?? ''))
    return `the ${ordinals} ${weekday} of ${monthSpan(interval)}`
  }
  if (bymonthday && !byday) {
    return `the ${joinWithAnd(bymonthday.split(',').map(dayOfMonthWord))} of ${monthSpan(interval)}`
  }
  if (!byday && !bymonthday) return interval === 1 ? 'every month' : monthSpan(interval)
  return null
}

/** "the third Tuesday, Wednesday or Thursday of each month", "the last weekday of each month". */
function describeMonthlyPosition(parts: Map<string, string>, interval: number): string | null {
  const position = ORDINAL_WORDS[parts.get('BYSETPOS') ?? '']
  const days = (parts.get('BYDAY') ?? '').split(',')
  const plain = WEEKDAY_CODES.filter((code) => days.includes(code))
  const extraParts = ['BYMONTHDAY', 'BYYEARDAY', 'BYWEEKNO', 'BYMONTH'].some((key) => parts.has(key))
  if (!position || plain.length === 0 || plain.length !== days.length || extraParts) return null
  const isWorkweek = plain.join(',') === 'MO,TU,WE,TH,FR'
  const names = plain.map((d) => WEEKDAY_NAMES[d])
  const list = isWorkweek ? 'weekday' : `${names.slice(0, -1).join(', ')}${names.length > 1 ? ' or ' : ''}${names[names.length - 1]}`
  return `the ${position} ${list} of ${monthSpan(interval)}`
}

function describeCommonShape(parts: Map<string, string>): string | null {
  if (parts.get('FREQ') === 'MONTHLY' && parts.has('BYSETPOS')) {
    return describeMonthlyPosition(parts, Number(parts.get('INTERVAL') ?? '1'))
  }
  const complex = ['BYSETPOS', 'BYYEARDAY', 'BYWEEKNO', 'BYMONTH'].some((key) => parts.has(key))
  if (complex) return null
  const interval = Number(parts.get('INTERVAL') ?? '1')
  const byday = parts.get('BYDAY')
  const plainDays = byday ? byday.split(',').filter((d): d is WeekdayCode => WEEKDAY_CODES.includes(d as WeekdayCode)) : []
  if (byday && plainDays.length !== byday.split(',').length && parts.get('FREQ') !== 'MONTHLY') return null
  const ordered = WEEKDAY_CODES.filter((code) => plainDays.includes(code))
  switch (parts.get('FREQ')) {
    case 'DAILY':
      if (parts.has('BYMONTHDAY')) return null
      if (byday) return interval === 1 ? describeWeekly(ordered, 1) : null
      return interval === 1 ? 'every day' : interval === 2 ? 'every other day' : `every ${interval} days`
    case 'WEEKLY':
      return parts.has('BYMONTHDAY') ? null : describeWeekly(ordered, interval)
    case 'MONTHLY':
      return describeMonthly(parts, interval)
    default:
      return null
  }
}

function countSuffix(parts: Map<string, string>): string {
  const count = parts.get('COUNT')
  if (count === undefined) return ''
  return count === '1' ? ', once' : `, ${count} times`
}

/** Plain English for a rule: "every Monday and Wednesday", "the first Monday of each month". */
export function describeRule(rrule: string): string {
  if (validateRule(rrule)) return 'an unreadable rule'
  const parts = ruleParts(rrule)
  const common = parts ? describeCommonShape(parts) : null
  if (common && parts) return `${common}${countSuffix(parts)}`
  // Unusual shapes: rrule's own wording ("every year in June, July for 10 times").
  return new RRule(RRule.parseString(stripRulePrefix(rrule))).toText().replace(/ for (\d+) times?$/, ', $1 times')
}
