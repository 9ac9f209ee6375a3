// The hand-written iCalendar lines (shared/domain/icalendar.ts), read back with ical.js.
import { describe, expect, it } from 'vitest'
import ICAL from 'ical.js'
import { decodeParamValue, escapeText, foldLine, paramValue, writeLines } from '../../../../shared/domain/icalendar'

const NAMES = [
  'Ann "Annie" O\'Brien', 'Ruiz; Maria', 'Lee, Jun', 'Dr: Who', 'Back\\slash', 'Zoë Ørsted-Ñúñez', '李小龍', 'Sam 🦷😀 Smile', 'Caret ^ and ^n',
]

function calendarWith(cn: string, summary: string): string {
  return writeLines([
    { name: 'BEGIN', value: 'VCALENDAR' }, { name: 'VERSION', value: '2.0' }, { name: 'PRODID', value: '-//test//EN' },
    { name: 'BEGIN', value: 'VEVENT' }, { name: 'UID', value: 'x@cuspline' }, { name: 'DTSTAMP', value: '20270111T170000Z' },
    { name: 'SUMMARY', value: escapeText(summary) },
    { name: 'ATTENDEE', params: [['CN', cn], ['RSVP', 'TRUE']], value: 'mailto:p@fernhollow.test' },
    { name: 'END', value: 'VEVENT' }, { name: 'END', value: 'VCALENDAR' },
  ])
}

describe('parameter values', () => {
  it('never leave a double quote inside a parameter value (RFC 5545 §3.2; RFC 6868 §3 encodes it as ^\')', () => {
    expect(paramValue('Ann "Annie" O\'Brien')).toBe("Ann ^'Annie^' O'Brien")
    expect(paramValue('a^b')).toBe('a^^b')
    expect(decodeParamValue(paramValue('a^b "c"'))).toBe('a^b "c"')
  })

  it('quote values holding ":", ";" or "," (RFC 5545 §3.2 param-value = paramtext / quoted-string)', () => {
    expect(paramValue('Ruiz; Maria')).toBe('"Ruiz; Maria"')
    expect(paramValue('Lee, Jun')).toBe('"Lee, Jun"')
    expect(paramValue('Dr: Who')).toBe('"Dr: Who"')
    expect(paramValue('Plain')).toBe('Plain')
  })

  it.each(NAMES)('round-trips the name %s through ical.js (RFC 5545 §3.2, RFC 6868 §3)', (name) => {
    const calendar = new ICAL.Component(ICAL.parse(calendarWith(name, `Visit for ${name}`)))
    const vevent = calendar.getFirstSubcomponent('vevent')!
    const attendee = vevent.getFirstProperty('attendee')!
    expect(attendee.getParameter('cn')).toBe(name)
    expect(attendee.getParameter('rsvp')).toBe('TRUE')
    expect(vevent.getFirstPropertyValue('summary')).toBe(`Visit for ${name}`)
  })
})

describe('folding', () => {
  it('folds at 75 octets, never inside a UTF-8 sequence (RFC 5545 §3.1)', () => {
    const line = `ATTENDEE;CN=${'Zoë 李 🦷 '.repeat(20)}:mailto:p@fernhollow.test`
    const folded = foldLine(line)
    const physical = folded.split('\r\n')
    expect(physical.length).toBeGreaterThan(3)
    for (const part of physical) {
      expect(Buffer.byteLength(part, 'utf8')).toBeLessThanOrEqual(75)
      // Each physical line is valid UTF-8 on its own: no sequence was cut.
      expect(Buffer.from(part, 'utf8').toString('utf8')).toBe(part)
      expect(part).not.toContain('\uFFFD')
    }
    expect(physical.slice(1).every((part) => part.startsWith(' '))).toBe(true)
    // Unfolding (RFC 5545 §3.1: remove CRLF followed by one space) gives the line back.
    expect(folded.replace(/\r\n /g, '')).toBe(line)
  })

  it('leaves a short line alone and ends every line with CRLF (RFC 5545 §3.1)', () => {
    expect(foldLine('VERSION:2.0')).toBe('VERSION:2.0')
    const text = calendarWith('Plain', 'x')
    expect(text.endsWith('\r\n')).toBe(true)
    expect(text.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/)
  })
})

describe('TEXT values', () => {
  it('escape backslash, semicolon, comma and line breaks (RFC 5545 §3.3.11)', () => {
    expect(escapeText('a\\b;c,d\ne')).toBe('a\\\\b\\;c\\,d\\ne')
  })
})
