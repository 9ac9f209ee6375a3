// Writing iCalendar text (RFC 5545) by hand, the few lines Cuspline needs: escaped TEXT values
// (§3.3.11), parameter values encoded per RFC 6868 and quoted when needed (§3.2), and lines folded
// at 75 octets without splitting a UTF-8 sequence (§3.1). Pure: no framework imports.

/** A TEXT value (RFC 5545 §3.3.11): backslash, semicolon, comma and line breaks escaped. */
export function escapeText(value: string): string {
  return value.replace(/\\/g, '\\\\').replace(/;/g, '\\;').replace(/,/g, '\\,').replace(/\r\n|\r|\n/g, '\\n')
}

/**
 * A parameter value (RFC 5545 §3.2 with RFC 6868 §3): `^` → `^^`, a line break → `^n`, `"` → `^'`;
 * quoted when it holds `:`, `;` or `,`. Control characters (never valid in a parameter) are dropped.
 */
export function paramValue(value: string): string {
  // eslint-disable-next-line no-control-regex -- dropping control characters is the point
  const encoded = value.replace(/\^/g, '^^').replace(/\r\n|\r|\n/g, '^n').replace(/"/g, "^'").replace(/[\u0000-\u0008\u000A-\u001F\u007F]/g, '')
  return /[:;,]/.test(encoded) || encoded !== encoded.trim() ? `"${encoded}"` : encoded
}

/** RFC 6868 §3 in reverse, for reading a parameter value someone else wrote. */
export function decodeParamValue(value: string): string {
  return value.replace(/\^(\^|n|')/g, (_match, code: string) => (code === 'n' ? '\n' : code === "'" ? '"' : '^'))
}

const encoder = new TextEncoder()

/**
 * One content line folded to at most 75 octets per physical line (RFC 5545 §3.1): continuation lines
 * start with one space, which counts towards their 75. A UTF-8 sequence is never split, because we fold
 * between code points (an emoji's surrogate pair stays together).
 */
export function foldLine(line: string): string {
  const out: string[] = []
  let current = ''
  let octets = 0
  for (const char of line) {
    const size = encoder.encode(char).length
    if (octets + size > 75) {
      out.push(current)
      current = ' '
      octets = 1
    }
    current += char
    octets += size
  }
  out.push(current)
  return out.join('\r\n')
}

export interface ContentLine {
  name: string
  params?: Array<[string, string]>
  /** Already in the property's value format (use escapeText for TEXT values). */
  value: string
}

/** Content lines joined with CRLF (RFC 5545 §3.1), each folded, ending with CRLF. */
export function writeLines(lines: ContentLine[]): string {
  return lines.map(({ name, params = [], value }) => foldLine(`${name}${params.map(([key, param]) => `;${key}=${paramValue(param)}`).join('')}:${value}`)).join('\r\n') + '\r\n'
}

/** A UTC DATE-TIME (RFC 5545 §3.3.5, form #2): 20270111T170000Z. */
export function utcDateTime(ms: number): string {
  return new Date(ms).toISOString().replace(/[-:]/g, '').replace(/\.\d{3}/, '')
}
