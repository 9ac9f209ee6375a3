// Writing CSV (RFC 4180: comma-separated, CRLF line ends, fields with a comma, quote or line break
// quoted, quotes doubled) with cells escaped against spreadsheet formula injection: a cell starting
// with =, +, -, @, a tab or a carriage return gets a leading apostrophe (OWASP, "CSV Injection").

const FORMULA_START = /^[=+\-@\t\r]/

/** One cell, safe to open in a spreadsheet and quoted as RFC 4180 asks. */
export function csvCell(value: string | number | boolean | null | undefined): string {
  if (value === null || value === undefined) return ''
  let text = String(value)
  if (typeof value === 'string' && FORMULA_START.test(text)) text = `'${text}`
  return /[",\r\n;]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text
}

/** A header row and data rows as CSV text, each line ending CRLF. */
export function toCsv(header: readonly string[], rows: readonly (readonly (string | number | boolean | null | undefined)[])[]): string {
  return [header, ...rows].map((row) => row.map(csvCell).join(',')).join('\r\n') + '\r\n'
}
