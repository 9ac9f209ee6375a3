// The Rota form's plain choices ("every Monday and Wednesday", "every other Friday", "the first
// Monday of each month") turned into an RRULE and back, so nobody has to type one.
import type { IsoWeekday } from '../types/rota'
import { buildMonthlyNthWeekdayRule, buildWeeklyRule } from './recurrence/build'
import { validateRule } from './recurrence/rules'

export type RuleChoice =
  | { mode: 'weekly'; weekdays: IsoWeekday[]; interval: number }
  | { mode: 'monthly'; nth: number; weekday: IsoWeekday }
  /** A rule the simple choices cannot show (set by hand or by an import): kept as it is. */
  | { mode: 'custom'; rrule: string }

const CODES = ['MO', 'TU', 'WE', 'TH', 'FR', 'SA', 'SU'] as const

function isoWeekdayOf(code: string): IsoWeekday | null {
  const index = CODES.indexOf(code as (typeof CODES)[number])
  return index < 0 ? null : ((index + 1) as IsoWeekday)
}

/** null when the choice is incomplete (no weekday ticked), so the form can say so. */
export function ruleFromChoice(choice: RuleChoice): string | null {
  if (choice.mode === 'custom') return validateRule(choice.rrule) ? null : choice.rrule.trim()
  if (choice.mode === 'monthly') return buildMonthlyNthWeekdayRule({ nth: choice.nth, weekday: choice.weekday })
  if (choice.weekdays.length === 0) return null
  return buildWeeklyRule({ weekdays: choice.weekdays, interval: choice.interval })
}

function partsOf(rrule: string): Map<string, string> {
  return new Map(rrule.replace(/^RRULE:/i, '').split(';').map((part) => {
    const [key = '', value = ''] = part.split('=')
    return [key.trim().toUpperCase(), value.trim().toUpperCase()]
  }))
}

/** The simple choice that builds exactly this rule, or 'custom'. */
export function choiceFromRule(rrule: string): RuleChoice {
  const parts = partsOf(rrule)
  const keys = [...parts.keys()].sort().join(',')
  const interval = Number(parts.get('INTERVAL') ?? '1')
  const byday = parts.get('BYDAY') ?? ''
  if (parts.get('FREQ') === 'WEEKLY' && (keys === 'BYDAY,FREQ' || keys === 'BYDAY,FREQ,INTERVAL')) {
    const weekdays = byday.split(',').map(isoWeekdayOf)
    if (weekdays.every((day): day is IsoWeekday => day !== null) && interval >= 1 && interval <= 4) {
      return { mode: 'weekly', weekdays: [...new Set(weekdays)].sort((a, b) => a - b), interval }
    }
  }
  const monthly = /^(-1|[1-4])(MO|TU|WE|TH|FR|SA|SU)$/.exec(byday)
  if (parts.get('FREQ') === 'MONTHLY' && keys === 'BYDAY,FREQ' && monthly) {
    return { mode: 'monthly', nth: Number(monthly[1]), weekday: isoWeekdayOf(monthly[2]!)! }
  }
  return { mode: 'custom', rrule }
}
