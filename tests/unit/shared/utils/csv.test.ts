import { describe, expect, it } from 'vitest'
import { csvCell, toCsv } from '../../../../shared/utils/csv'
import { parseDateInput } from '../../../../shared/utils/display-time'

describe('CSV cells', () => {
  // OWASP, "CSV Injection": cells beginning with =, +, -, @, tab (0x09) or carriage return (0x0D) get a
  // leading single quote so a spreadsheet reads them as text, and the cell is quoted.
  it('escapes formula-looking cells as the OWASP CSV injection rule says', () => {
    expect(csvCell('=HYPERLINK("http://x.test","click")')).toBe('"\'=HYPERLINK(""http://x.test"",""click"")"')
    expect(csvCell('+1 209 555 0177')).toBe("'+1 209 555 0177")
    expect(csvCell('-2+3')).toBe("'-2+3")
    expect(csvCell('@SUM(A1)')).toBe("'@SUM(A1)")
    expect(csvCell('\tx')).toBe("'\tx")
    expect(csvCell('\rx')).toBe('"\'\rx"')
    expect(csvCell('Ann = Bea')).toBe('Ann = Bea')
    expect(csvCell(-5)).toBe('-5')
  })

  it('quotes commas, semicolons, quotes and line breaks (RFC 4180 §2)', () => {
    expect(csvCell('a,b')).toBe('"a,b"')
    expect(csvCell('a;b')).toBe('"a;b"')
    expect(csvCell('say "hi"')).toBe('"say ""hi"""')
    expect(csvCell('two\nlines')).toBe('"two\nlines"')
    expect(csvCell(null)).toBe('')
    expect(toCsv(['a', 'b'], [[1, 'x,y']])).toBe('a,b\r\n1,"x,y"\r\n')
  })
})

describe('import dates', () => {
  it('reads ISO dates and the site order, refusing impossible and two-digit-year dates', () => {
    expect(parseDateInput('1984-07-09', 'day-month-year')).toBe('1984-07-09')
    expect(parseDateInput('07/09/1984', 'month-day-year')).toBe('1984-07-09')
    expect(parseDateInput('09.07.1984', 'day-month-year')).toBe('1984-07-09')
    expect(parseDateInput('1984/07/09', 'year-month-day')).toBe('1984-07-09')
    expect(parseDateInput('02/31/1990', 'month-day-year')).toBeNull()
    expect(parseDateInput('2000-02-29', 'month-day-year')).toBe('2000-02-29')
    expect(parseDateInput('1900-02-29', 'month-day-year')).toBeNull()
    expect(parseDateInput('07/09/84', 'month-day-year')).toBeNull()
    expect(parseDateInput('yesterday', 'month-day-year')).toBeNull()
  })
})
