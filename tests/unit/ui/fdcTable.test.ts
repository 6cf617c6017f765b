import { describe, expect, it } from 'vitest'
import { blankRow, checkFdcRows, type FdcRow, fdcRowErrorsFromIssues, rowsFromPoints, sortRows } from '../../../utils/fdcTable'
import { parseTypedNumber } from '../../../utils/numberTable'
import { FdcPointsSchema } from '../../../shared/schemas/site'

const rows = (...pairs: [string, string][]): FdcRow[] => pairs.map(([exceedance, flow], i) => ({ key: i + 1, exceedance, flow }))

describe('parseTypedNumber', () => {
  it('reads numbers, a decimal comma and exponents; blank is null; anything else NaN', () => {
    expect(parseTypedNumber(' 2.5 ')).toBe(2.5)
    expect(parseTypedNumber('0,75')).toBe(0.75)
    expect(parseTypedNumber('.5')).toBe(0.5)
    expect(parseTypedNumber('1e-3')).toBe(0.001)
    expect(parseTypedNumber('')).toBeNull()
    expect(parseTypedNumber('   ')).toBeNull()
    expect(parseTypedNumber('12abc')).toBeNaN()
    expect(parseTypedNumber('1.2.3')).toBeNaN()
  })
})

describe('checkFdcRows', () => {
  it('accepts a sorted, non-increasing curve and gives the points the schema also accepts', () => {
    const out = checkFdcRows(rows(['5', '12'], ['50', '3.1'], ['95', '0.6'], ['99', '0.6']))
    expect(out.tableError).toBe('')
    expect(out.rowErrors.every((e) => !e.exceedance && !e.flow)).toBe(true)
    expect(out.points).toEqual([
      { exceedance: 5, flow: 12 },
      { exceedance: 50, flow: 3.1 },
      { exceedance: 95, flow: 0.6 },
      { exceedance: 99, flow: 0.6 },
    ])
    expect(FdcPointsSchema.safeParse(out.points).success).toBe(true)
  })

  it('needs at least three points, unless an empty table is allowed', () => {
    expect(checkFdcRows(rows(['10', '5'], ['90', '1'])).tableError).toMatch(/at least 3 points/)
    expect(checkFdcRows(rows(['10', '5'], ['90', '1'])).points).toBeNull()
    expect(checkFdcRows([]).points).toBeNull()
    expect(checkFdcRows([], { allowEmpty: true })).toEqual({ rowErrors: [], tableError: '', points: [] })
    expect(checkFdcRows(rows(['10', '5'], ['90', '1']), { allowEmpty: true }).points).toBeNull()
  })

  it('flags blank, non-numeric and out-of-range cells on their own row', () => {
    const out = checkFdcRows(rows(['', '5'], ['abc', '-1'], ['101', 'x'], ['50', '']))
    expect(out.rowErrors[0]).toEqual({ exceedance: 'Enter the exceedance, %' })
    expect(out.rowErrors[1]).toEqual({ exceedance: 'Exceedance must be a number', flow: 'Flow must be 0 m³/s or more' })
    expect(out.rowErrors[2]).toEqual({ exceedance: 'Exceedance must be between 0 and 100 %', flow: 'Flow must be a number' })
    expect(out.rowErrors[3]).toEqual({ flow: 'Enter the flow, m³/s' })
    expect(out.points).toBeNull()
  })

  it('flags exceedance out of order or repeated, and flow that rises, on the offending row', () => {
    const out = checkFdcRows(rows(['10', '8'], ['50', '9'], ['40', '2'], ['40', '1']))
    expect(out.rowErrors[0]).toEqual({})
    expect(out.rowErrors[1]).toEqual({ flow: 'Flow must not rise as exceedance rises' })
    expect(out.rowErrors[2]?.exceedance).toMatch(/must rise/)
    // Row 4 repeats 40 but row 3's 40 was already out of order, so it compares with row 2's 50.
    expect(out.rowErrors[3]?.exceedance).toMatch(/must rise/)
    const repeat = checkFdcRows(rows(['10', '8'], ['10', '7'], ['90', '1']))
    expect(repeat.rowErrors[1]?.exceedance).toBe('This exceedance is repeated')
  })

  it('agrees with the server schema on which curves are acceptable', () => {
    const cases: [string, string][][] = [
      [['5', '10'], ['50', '4'], ['95', '1']],
      [['5', '10'], ['50', '11'], ['95', '1']],
      [['50', '4'], ['5', '10'], ['95', '1']],
      [['0', '10'], ['100', '0'], ['100', '0']],
    ]
    for (const c of cases) {
      const ours = checkFdcRows(rows(...c)).points !== null
      const theirs = FdcPointsSchema.safeParse(c.map(([e, f]) => ({ exceedance: Number(e), flow: Number(f) }))).success
      expect(ours).toBe(theirs)
    }
  })
})

describe('row helpers', () => {
  it('sorts by exceedance with blanks and junk last, keeping their order', () => {
    const sorted = sortRows(rows(['95', '1'], ['', '3'], ['5', '9'], ['x', '4'], ['50', '2']))
    expect(sorted.map((r) => r.exceedance)).toEqual(['5', '50', '95', '', 'x'])
  })

  it('makes rows from points with fresh keys, and blank rows', () => {
    const made = rowsFromPoints([{ exceedance: 5, flow: 2 }, { exceedance: 95, flow: 0.4 }])
    expect(made.map((r) => [r.exceedance, r.flow])).toEqual([['5', '2'], ['95', '0.4']])
    expect(new Set([...made, blankRow()].map((r) => r.key)).size).toBe(3)
  })

  it('maps server issues on fdcPoints.N.cell onto rows and the rest onto the table', () => {
    const out = fdcRowErrorsFromIssues({ 'fdcPoints.1.flow': 'flow must not rise', fdcPoints: 'an FDC needs at least 3 points', name: 'ignored', 'fdcPoints.9.flow': 'beyond' }, 3)
    expect(out.rowErrors).toEqual([{}, { flow: 'flow must not rise' }, {}])
    expect(out.tableError).toBe('an FDC needs at least 3 points')
  })
})
