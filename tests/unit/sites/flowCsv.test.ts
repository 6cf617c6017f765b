import { describe, expect, it } from 'vitest'
import { dateFormatOf, daySpan, decodeCsvBytes, parseDay, parseFlowCell, parseFlowCsv } from '../../../server/domain/flowCsv'

describe('parseDay', () => {
  it('reads ISO and day-first dates, with or without a time of day', () => {
    expect(parseDay('2020-02-29', 'iso')).toEqual({ date: '2020-02-29' })
    expect(parseDay('2020-2-3', 'iso')).toEqual({ date: '2020-02-03' })
    expect(parseDay('2020-02-03T09:00:00Z', 'iso')).toEqual({ date: '2020-02-03' })
    expect(parseDay('2020-02-03 00:00', 'iso')).toEqual({ date: '2020-02-03' })
    expect(parseDay('03/02/2020', 'day-first')).toEqual({ date: '2020-02-03' })
    expect(parseDay('3.2.2020', 'day-first')).toEqual({ date: '2020-02-03' })
    expect(parseDay('03-02-2020 12:30:00', 'day-first')).toEqual({ date: '2020-02-03' })
  })

  it('refuses impossible dates with a reason, leap years by the Gregorian rule', () => {
    // Gregorian calendar: 1900 is not a leap year, 2000 is (divisible by 400).
    expect(parseDay('1900-02-29', 'iso')).toEqual({ error: expect.stringMatching(/does not exist/) })
    expect(parseDay('2000-02-29', 'iso')).toEqual({ date: '2000-02-29' })
    expect(parseDay('31/04/2020', 'day-first')).toEqual({ error: expect.stringMatching(/does not exist.*30 days/) })
    expect(parseDay('2020-13-01', 'iso')).toEqual({ error: expect.stringMatching(/no month 13/) })
    expect(parseDay('05/13/2020', 'day-first')).toEqual({ error: expect.stringMatching(/no month 13.*day-first/) })
    expect(parseDay('1066-10-14', 'iso')).toEqual({ error: expect.stringMatching(/out of range/) })
    expect(parseDay('', 'iso')).toEqual({ error: 'the date is missing' })
    expect(parseDay('yesterday', 'iso')).toEqual({ error: expect.stringMatching(/not a date/) })
    expect(parseDay('20/01/2020', 'iso')).toEqual({ error: expect.stringMatching(/day-first/) })
    expect(parseDay('2020-01-20', 'day-first')).toEqual({ error: expect.stringMatching(/YYYY-MM-DD/) })
    expect(parseDay('03/02.2020', 'day-first')).toEqual({ error: expect.stringMatching(/not a date/) })
  })

  it('tells the two forms apart', () => {
    expect(dateFormatOf('2020-01-01')).toBe('iso')
    expect(dateFormatOf(' 01.01.2020 ')).toBe('day-first')
    expect(dateFormatOf('Jan 1 2020')).toBeNull()
  })
})

describe('parseFlowCell', () => {
  it('reads numbers, gap words and flagged values', () => {
    expect(parseFlowCell(' 3.25 ', false)).toEqual({ flow: 3.25, flagged: false })
    expect(parseFlowCell('1e-3', false)).toEqual({ flow: 0.001, flagged: false })
    expect(parseFlowCell('0', false)).toEqual({ flow: 0, flagged: false })
    expect(parseFlowCell('2,5', true)).toEqual({ flow: 2.5, flagged: false })
    for (const gap of ['', '-', 'NA', 'n/a', 'NaN', 'null', 'M']) expect(parseFlowCell(gap, false), gap).toEqual({ flow: null, flagged: false })
    expect(parseFlowCell('12.3*', false)).toEqual({ flow: null, flagged: true })
    expect(parseFlowCell('12.3 ?', false)).toEqual({ flow: null, flagged: true })
  })

  it('refuses text, negative and implausible flows, and a decimal comma outside semicolon files', () => {
    expect(parseFlowCell('high', false)).toEqual({ error: 'flow "high" is not a number' })
    expect(parseFlowCell('-0.5', false)).toEqual({ error: 'flow -0.5 is negative' })
    expect(parseFlowCell('2e7', false)).toEqual({ error: expect.stringMatching(/not plausible/) })
    expect(parseFlowCell('2,5', false)).toEqual({ error: expect.stringMatching(/not a number/) })
    expect(parseFlowCell('1,234.5', true)).toEqual({ error: expect.stringMatching(/not a number/) })
    expect(parseFlowCell('abc*', false)).toEqual({ error: expect.stringMatching(/not a number/) })
  })
})

describe('parseFlowCsv', () => {
  it('finds the columns by name and sorts the days', () => {
    const r = parseFlowCsv('Date,Discharge (m3/s),Flag\n2020-01-03,3,\n2020-01-01,1,G\n2020-01-02,2,R\n')
    expect(r).toMatchObject({ ok: true, dateColumn: 'Date', flowColumn: 'Discharge (m3/s)', flagColumn: 'Flag', delimiter: ',', dateFormat: 'iso', gaps: 1, flagged: 1 })
    if (r.ok) expect(r.days).toEqual([{ date: '2020-01-01', flow: 1 }, { date: '2020-01-02', flow: null }, { date: '2020-01-03', flow: 3 }])
  })

  it('detects semicolons and tabs from the header line', () => {
    expect(parseFlowCsv('day;q\n01.01.2020;1,5\n')).toMatchObject({ ok: true, delimiter: ';', dateFormat: 'day-first', days: [{ date: '2020-01-01', flow: 1.5 }] })
    expect(parseFlowCsv('date\tflow\n2020-01-01\t7\n')).toMatchObject({ ok: true, delimiter: '\t', days: [{ date: '2020-01-01', flow: 7 }] })
  })

  it('takes the other column of a two-column file with a date column as the flow', () => {
    expect(parseFlowCsv('date,Brackwin at gauge\n2020-01-01,4\n')).toMatchObject({ ok: true, flowColumn: 'Brackwin at gauge' })
  })

  it('counts file lines past comments, blank lines, CRLF and quoted fields holding a line break', () => {
    const r = parseFlowCsv('# a comment\r\n\r\ndate,flow,note\r\n2020-01-01,1,"two\nlines"\r\n2020-01-02,bad,x\r\n')
    expect(r).toMatchObject({ ok: false, kind: 'lines', errors: [{ line: 6, reason: 'flow "bad" is not a number' }] })
  })

  it('holds every line to the date form of the first one, unless told', () => {
    expect(parseFlowCsv('date,flow\n2020-01-01,1\n02/01/2020,2\n')).toMatchObject({ ok: false, errors: [{ line: 3 }] })
    expect(parseFlowCsv('date,flow\n2020-01-01,1\n', { dateFormat: 'day-first' })).toMatchObject({ ok: false, errors: [{ line: 2 }] })
  })

  it('reports every bad line at once, with both problems of one line', () => {
    const r = parseFlowCsv('date,flow\n2020-02-30,-1\n2020-01-01,1\n2020-01-01,x\n')
    expect(r).toMatchObject({
      ok: false,
      errors: [
        { line: 2, reason: expect.stringMatching(/does not exist.*; flow -1 is negative/) },
        { line: 4, reason: expect.stringMatching(/given twice \(first on line 3\); flow "x" is not a number/) },
      ],
    })
  })

  it('refuses days already stored when appending, and too many days', () => {
    expect(parseFlowCsv('date,flow\n2020-01-01,1\n2020-01-02,1\n', { existingDays: new Set(['2020-01-02']) })).toMatchObject({ ok: false, errors: [{ line: 3, reason: expect.stringMatching(/already stored/) }] })
    expect(parseFlowCsv('date,flow\n2020-01-01,1\n2020-01-02,1\n2020-01-03,1\n', { maxDays: 2 })).toMatchObject({ ok: false, errors: [{ line: 4 }] })
  })

  it('asks for the columns when they are unclear or named wrongly, and wants a header row', () => {
    expect(parseFlowCsv('date,flow1,flow2\n2020-01-01,1,2\n')).toMatchObject({ ok: false, kind: 'columns', header: ['date', 'flow1', 'flow2'] })
    expect(parseFlowCsv('a,b,c\n2020-01-01,1,2\n')).toMatchObject({ ok: false, kind: 'columns', message: expect.stringMatching(/^dateColumn:/) })
    expect(parseFlowCsv('date,flow\n2020-01-01,1\n', { flowColumn: 'Q' })).toMatchObject({ ok: false, kind: 'columns', message: expect.stringMatching(/^flowColumn:/) })
    expect(parseFlowCsv('a,b,c\n2020-01-01,1,2\n', { dateColumn: 'A', flowColumn: 'c' })).toMatchObject({ ok: true, days: [{ date: '2020-01-01', flow: 2 }] })
    expect(parseFlowCsv('2020-01-01,1\n')).toMatchObject({ ok: false, kind: 'lines', errors: [{ line: 1 }] })
    expect(parseFlowCsv('date,flow\n')).toMatchObject({ ok: false, kind: 'lines', errors: [{ line: 2 }] })
    expect(parseFlowCsv('\n\n')).toMatchObject({ ok: false, kind: 'lines' })
  })
})

describe('decodeCsvBytes and daySpan', () => {
  it('decodes UTF-8 (dropping a BOM), UTF-16LE with a BOM and Windows-1252; refuses binary', () => {
    expect(decodeCsvBytes(new Uint8Array([0xef, 0xbb, 0xbf, 0x61, 0x62]))).toBe('ab')
    expect(decodeCsvBytes(new Uint8Array([0xff, 0xfe, 0x61, 0, 0x62, 0]))).toBe('ab')
    expect(decodeCsvBytes(new Uint8Array([0x6d, 0xb3]))).toBe('m³')
    expect(decodeCsvBytes(new Uint8Array([0x61, 0, 0x62]))).toBeNull()
  })

  it('counts days inclusively across leap days', () => {
    expect(daySpan('2020-02-28', '2020-03-01')).toBe(3)
    expect(daySpan('2020-01-01', '2020-01-01')).toBe(1)
    expect(daySpan('1920-01-01', '2019-12-31')).toBe(36_525)
  })
})

describe('refusals echo little of the file', () => {
  it('quotes at most 100 characters of a bad cell, and says how long it was', () => {
    const r = parseFlowCsv(`date,flow\n2020-01-01,${'9x'.repeat(50_000)}\n`)
    expect(r.ok).toBe(false)
    if (r.ok || r.kind !== 'lines') return
    expect(r.errors[0]!.reason).toMatch(/^flow "(9x){50}… \(100,000 characters\)" is not a number$/)
    expect(r.message.length).toBeLessThan(300)
    expect(parseDay(`2020-01-01${'7'.repeat(10_000)}`, 'iso')).toEqual({ error: expect.stringMatching(/^"2020-01-017+… \(10,010 characters\)" is not a date/) })
  })

  it('refuses a column name longer than 200 characters', () => {
    expect(parseFlowCsv(`date,${'h'.repeat(201)}\n2020-01-01,1\n`)).toMatchObject({ ok: false, kind: 'lines', errors: [{ line: 1, reason: expect.stringMatching(/column 2's name .* is longer than 200 characters/) }] })
    expect(parseFlowCsv(`date,${'h'.repeat(200)}\n2020-01-01,1\n`)).toMatchObject({ ok: true })
  })

  it('refuses a file of more than 160,000 lines, or a header of more than 100 columns, before parsing it', () => {
    // 10 MB of empty lines once took 800 MB to parse.
    expect(parseFlowCsv(`date,flow\n${'\n'.repeat(200_000)}`)).toMatchObject({ ok: false, kind: 'lines', errors: [{ line: 160_001, reason: expect.stringMatching(/more than 160,000 lines/) }] })
    // 160,000 lines exactly (a last line end starts no new line) are read: here, as a header and no days.
    expect(parseFlowCsv(`date,flow\n${'\n'.repeat(159_999)}`)).toMatchObject({ ok: false, errors: [{ reason: 'the file has a header but no days' }] })
    expect(parseFlowCsv(`# note\ndate,flow${',x'.repeat(99)}\n2020-01-01,1\n`)).toMatchObject({ ok: false, errors: [{ line: 2, reason: 'the header has more than 100 columns' }] })
    expect(parseFlowCsv(`date,flow${',x'.repeat(98)}\n2020-01-01,1\n`)).toMatchObject({ ok: true })
  })

  it('lists the first 1,000 bad lines and counts them all', () => {
    const r = parseFlowCsv(`date,flow\n${'2020-01-01\n'.repeat(5000)}`)
    expect(r).toMatchObject({ ok: false, kind: 'lines', errorCount: 5000 })
    if (r.ok || r.kind !== 'lines') return
    expect(r.errors).toHaveLength(1000)
    expect(r.errors[999]!.line).toBe(1001)
    expect(r.message).toMatch(/^file: line 2: the line has 1 field; the header has 2 \(and 4999 more lines\); nothing was stored$/)
  })
})
