// DATE columns hold site-local calendar dates; mysql2 (timezone 'Z') hands them back as a
// Date at UTC midnight, so the UTC fields are the local date. Never read them in the machine zone.
export function dateColumn(value: Date | string): string {
  return typeof value === 'string' ? value.slice(0, 10) : value.toISOString().slice(0, 10)
}

export function nullableDateColumn(value: Date | string | null): string | null {
  return value === null ? null : dateColumn(value)
}
