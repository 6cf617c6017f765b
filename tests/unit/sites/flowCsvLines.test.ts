// parseFlowCsv reads a file without quote characters in one whole papaparse parse (row i is line i + 1)
// and a file with quoted fields row by row (lines counted from where each row ends). These tests hold
// both readers to the same line numbers, and the plain date and flow readers of the hot loop to the
// general parseDay and parseFlowCell.
import { describe, expect, it } from 'vitest'
import { parseDay, parseFlowCell, parseFlowCsv } from '../../../server/domain/flowCsv'

/** The lines named by a refused file's errors. */
function badLines(text: string, options: Parameters<typeof parseFlowCsv>[1] = {}): number[] {
  const r = parseFlowCsv(text, options)
  if (r.ok || r.kind !== 'lines') throw new Error(`expected bad lines, got ${JSON.stringify(r).slice(0, 200)}`)
  return r.errors.map((e) => e.line)
}

// Line 1 a comment, 2 blank, 3 the header, 4 good, 5 spaces only, 6 bad flow, 7 another comment, 8 good,
// 9 bad date, 10 good, 11 too few fields.
const FILE = ['# exported by hand', '', 'date,flow,note', '2020-01-01,1,a', '   ', '2020-01-02,bad,b', '# checked', '2020-01-03,3,c', '2020-02-30,4,d', '2020-01-04,4,e', '2020-01-05']

describe('line numbers in errors', () => {
  it('name the same lines whether or not the file holds a quote character', () => {
    const plain = `${FILE.join('\n')}\n`
    expect(plain.includes('"')).toBe(false)
    expect(badLines(plain)).toEqual([6, 9, 11])
    // One quoted note sends the same lines through the row-by-row reader.
    const quoted = plain.replace('2020-01-03,3,c', '2020-01-03,3,"c"')
    expect(badLines(quoted)).toEqual([6, 9, 11])
  })

  it('count CRLF and lone CR line ends as one line each, with or without a last line end', () => {
    for (const end of ['\r\n', '\r']) {
      expect(badLines(FILE.join(end) + end), JSON.stringify(end)).toEqual([6, 9, 11])
      expect(badLines(FILE.join(end)), JSON.stringify(end)).toEqual([6, 9, 11])
      expect(badLines(FILE.join(end).replace('2020-01-04,4,e', '"2020-01-04",4,e')), JSON.stringify(end)).toEqual([6, 9, 11])
    }
  })

  it('are not shifted by a byte order mark, in either reader', () => {
    // A one-character last line right after a BOM-led file: the row-by-row count once put it a line early.
    expect(badLines('\ufeffdate,flow\n2020-01-01,1\nx')).toEqual([3])
    expect(badLines('\ufeffdate,flow\n2020-01-01,"1"\nx')).toEqual([3])
    expect(badLines(`\ufeff${FILE.join('\n')}`)).toEqual([6, 9, 11])
    expect(badLines(`\ufeff${FILE.join('\r\n').replace('1,a', '1,"a"')}`)).toEqual([6, 9, 11])
    expect(parseFlowCsv('\ufeffdate,flow\n2020-01-01,1\n')).toMatchObject({ ok: true, header: ['date', 'flow'], dateColumn: 'date' })
  })

  it('count a quoted field holding line breaks as the lines it spans, and name the line a row starts on', () => {
    const text = ['date,flow,note', '2020-01-01,1,"first', 'second', 'third"', '2020-01-02,x,"also', 'two"', '2020-01-03,y,z'].join('\n')
    expect(badLines(text)).toEqual([5, 7])
    expect(badLines(text.replace(/\n/g, '\r\n'))).toEqual([5, 7])
  })

  it('read a # inside a quoted field as data, not a comment', () => {
    expect(badLines('date,flow,note\n2020-01-01,1,"note\n# still the note"\n2020-01-02,x,y\n')).toEqual([4])
    // Unquoted, the same line is a comment and the line numbers still count it.
    expect(badLines('date,flow,note\n2020-01-01,1,note\n# a comment\n2020-01-02,x,y\n')).toEqual([4])
  })

  it('report a line of delimiters only, and skip lines of spaces only', () => {
    expect(parseFlowCsv('date,flow\n2020-01-01,1\n,\n  \t \n2020-01-02,x\n')).toMatchObject({
      ok: false,
      errors: [
        { line: 3, reason: 'the date is missing' },
        { line: 5, reason: 'flow "x" is not a number' },
      ],
    })
  })

  it('name the first line over the day limit, past blank lines', () => {
    expect(parseFlowCsv('date,flow\n2020-01-01,1\n\n2020-01-02,1\n\n2020-01-03,1\n', { maxDays: 2 })).toMatchObject({ ok: false, errors: [{ line: 6 }] })
  })
})

describe('days in and out of order', () => {
  it('keeps days given in order as they are and sorts days given out of order', () => {
    const inOrder = parseFlowCsv('date,flow\n2020-01-01,1\n2020-01-02,2\n2020-01-03,3\n')
    expect(inOrder.ok && inOrder.days.map((d) => d.date)).toEqual(['2020-01-01', '2020-01-02', '2020-01-03'])
    const outOfOrder = parseFlowCsv('date,flow\n2020-01-03,3\n2020-01-01,1\n2020-01-02,2\n2019-12-31,0\n')
    expect(outOfOrder.ok && outOfOrder.days).toEqual([
      { date: '2019-12-31', flow: 0 },
      { date: '2020-01-01', flow: 1 },
      { date: '2020-01-02', flow: 2 },
      { date: '2020-01-03', flow: 3 },
    ])
  })

  it('finds a day given twice wherever the two lines are, naming the first', () => {
    expect(parseFlowCsv('date,flow\n2020-01-01,1\n2020-01-01,2\n')).toMatchObject({ ok: false, errors: [{ line: 3, reason: 'day 2020-01-01 is given twice (first on line 2)' }] })
    // In order until line 4, then a step back to a day first given on line 3, then one back to line 2.
    const r = parseFlowCsv('date,flow\n2020-01-01,1\n2020-01-03,3\n2020-01-05,5\n2020-01-03,3\n2020-01-04,4\n2020-01-01,1\n2020-01-05,5\n')
    expect(r).toMatchObject({
      ok: false,
      errors: [
        { line: 5, reason: 'day 2020-01-03 is given twice (first on line 3)' },
        { line: 7, reason: 'day 2020-01-01 is given twice (first on line 2)' },
        { line: 8, reason: 'day 2020-01-05 is given twice (first on line 4)' },
      ],
    })
    // A day whose flow was bad still counts as given; a day already stored does not.
    expect(parseFlowCsv('date,flow\n2020-01-02,x\n2020-01-01,1\n2020-01-02,2\n')).toMatchObject({
      ok: false,
      errors: [{ line: 2 }, { line: 4, reason: 'day 2020-01-02 is given twice (first on line 2)' }],
    })
    expect(parseFlowCsv('date,flow\n2020-01-02,2\n2020-01-02,2\n', { existingDays: new Set(['2020-01-02']) })).toMatchObject({
      ok: false,
      errors: [{ line: 2, reason: expect.stringMatching(/already stored/) }, { line: 3, reason: expect.stringMatching(/already stored/) }],
    })
  })
})

describe('the plain date and flow readers agree with parseDay and parseFlowCell', () => {
  /** The one day a one-line file reads, or its line's error, as `{ date, flow }` or `{ error }`. */
  function oneDay(header: string, line: string, options: Parameters<typeof parseFlowCsv>[1] = {}) {
    const r = parseFlowCsv(`${header}\n${line}\n`, options)
    if (r.ok) return { date: r.days[0]!.date, flow: r.days[0]!.flow }
    if (r.kind === 'lines') return { error: r.errors[0]!.reason }
    throw new Error(r.message)
  }

  it('reads every date form as parseDay does, calendar checks included', () => {
    // Gregorian calendar: 2000 is a leap year (divisible by 400), 1900 and 2021 are not.
    const iso = ['2020-01-05', '2000-02-29', '1900-02-29', '2021-02-29', '2020-04-31', '2020-12-31', '2020-13-01', '2020-00-10', '2020-01-00', '1799-12-31', '1800-01-01', '2200-12-31', '2201-01-01', '2020-1-05', '2020-01-05T06:00', '2020/01/05', '20200-1-05', '２020-01-05']
    for (const d of iso) {
      const want = parseDay(d, 'iso')
      expect(oneDay('date,flow', `${d},1`, { dateFormat: 'iso' }), d).toEqual('error' in want ? { error: want.error } : { date: want.date, flow: 1 })
    }
    const dayFirst = ['05/01/2020', '05.01.2020', '05-01-2020', '29/02/2000', '29/02/1900', '31/04/2020', '01/13/2020', '00/01/2020', '05/01.2020', '5/1/2020', '05/01/1799', '05/01/2020 12:00', '05:01:2020']
    for (const d of dayFirst) {
      const want = parseDay(d, 'day-first')
      expect(oneDay('date,flow', `${d},1`, { dateFormat: 'day-first' }), d).toEqual('error' in want ? { error: want.error } : { date: want.date, flow: 1 })
    }
  })

  it('reads every flow form as parseFlowCell does, in comma and semicolon files', () => {
    const flows = ['12', '3.25', '.5', '5.', '0', '00012', '1000000', '1000000.5', '1'.repeat(400), '.', '1.2.3', '2,5', '1,2,5', '2,5.1', ',5', '-1', '+1', '1e3', ' 7 ', 'NA', '', '12.3*', 'x']
    for (const q of flows) {
      for (const [header, sep, decimalComma] of [['date,flow', ',', false], ['date;flow', ';', true]] as const) {
        // A comma inside a comma file's cell must be quoted to stay one cell.
        const cell = sep === ',' && q.includes(',') ? `"${q}"` : q
        const want = parseFlowCell(q, decimalComma)
        const got = oneDay(header, `2020-01-05${sep}${cell}`)
        if ('error' in want) expect(got, `${sep} ${q}`).toEqual({ error: want.error })
        else expect(got, `${sep} ${q}`).toEqual({ date: '2020-01-05', flow: want.flow })
      }
    }
  })
})
