// Dates in imported spreadsheets: ISO (1984-07-09) always, and day/month/year or month/day/year
// (with /, . or - between) in the order the importing site writes dates. Four-digit years only: a
// two-digit year would have to be guessed. Kept small and on its own so a site-wide date format
// setting can take its place.
export const DATE_ORDERS = ['mdy', 'dmy', 'ymd'] as const
export type DateOrder = (typeof DATE_ORDERS)[number]
export const DATE_ORDER_LABELS: Record<DateOrder, string> = { mdy: 'month/day/year (07/09/1984)', dmy: 'day/month/year (09/07/1984)', ymd: 'year/month/day (1984/07/09)' }

function realDate(year: number, month: number, day: number): string | null {
  if (month < 1 || month > 12 || day < 1) return null
  const daysInMonth = new Date(Date.UTC(year, month, 0)).getUTCDate()
  if (day > daysInMonth) return null
  return `${String(year).padStart(4, '0')}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`
}

/** `yyyy-MM-dd`, or null when the text is not a real date in ISO or the given order. */
export function parseImportDate(text: string, order: DateOrder): string | null {
  const trimmed = text.trim()
  const iso = /^(\d{4})-(\d{1,2})-(\d{1,2})$/.exec(trimmed)
  if (iso) return realDate(Number(iso[1]), Number(iso[2]), Number(iso[3]))
  const parts = /^(\d{1,4})[/.-](\d{1,2})[/.-](\d{1,4})$/.exec(trimmed)
  if (!parts) return null
  const [a, b, c] = [parts[1]!, parts[2]!, parts[3]!]
  if (order === 'ymd') return a.length === 4 ? realDate(Number(a), Number(b), Number(c)) : null
  if (c.length !== 4) return null
  return order === 'mdy' ? realDate(Number(c), Number(a), Number(b)) : realDate(Number(c), Number(b), Number(a))
}
