import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { blankHeadRow, checkHeadRows, HEAD_TABLE_MAX_ROWS, headRowErrorsFromIssues, headRowsFrom, type HeadTableRow, headTableText, sortHeadRows } from '../../../utils/headTable'
import { HeadTableSchema } from '../../../shared/schemas/site'

const rows = (...pairs: [string, string][]): HeadTableRow[] => pairs.map(([flow, head], i) => ({ key: i + 1, flow, head }))

describe('checkHeadRows', () => {
  it('accepts flows rising down the table with the head falling, and gives the rows the schema also accepts', () => {
    // Tailwater rises in floods so the head falls (common practice, no source).
    const out = checkHeadRows(rows(['1', '1.35'], ['15', '1,12'], ['60', '0.5']))
    expect(out.tableError).toBe('')
    expect(out.rowErrors).toEqual([{}, {}, {}])
    expect(out.table).toEqual([
      { flow: 1, head: 1.35 },
      { flow: 15, head: 1.12 },
      { flow: 60, head: 0.5 },
    ])
    expect(HeadTableSchema.safeParse(out.table).success).toBe(true)
  })

  it('accepts an empty table (the gross head then holds at every flow) and a drowned weir with no head', () => {
    expect(checkHeadRows([])).toEqual({ rowErrors: [], tableError: '', table: [] })
    expect(checkHeadRows(rows(['2', '1.8'], ['80', '0'])).table).toEqual([{ flow: 2, head: 1.8 }, { flow: 80, head: 0 }])
  })

  it('names the cell and its unit for blank, non-numeric and out-of-range entries', () => {
    const out = checkHeadRows(rows(['', '1.2'], ['abc', '-0.1'], ['-3', '21'], ['40', '']))
    expect(out.rowErrors[0]).toEqual({ flow: 'Enter the river flow, m³/s' })
    expect(out.rowErrors[1]).toEqual({ flow: 'River flow must be a number', head: 'Head must be between 0 and 20 m' })
    expect(out.rowErrors[2]).toEqual({ flow: 'River flow must be 0 m³/s or more', head: 'Head must be between 0 and 20 m' })
    expect(out.rowErrors[3]).toEqual({ head: 'Enter the head, m' })
    expect(out.table).toBeNull()
  })

  it('flags a flow out of order or repeated on the offending row, comparing with the last valid flow', () => {
    const out = checkHeadRows(rows(['5', '2'], ['20', '1.6'], ['10', '1.8'], ['20', '1.5'], ['30', '1.2']))
    expect(out.rowErrors[0]).toEqual({})
    expect(out.rowErrors[1]).toEqual({})
    expect(out.rowErrors[2]?.flow).toMatch(/must rise down the table/)
    expect(out.rowErrors[3]?.flow).toBe('This river flow is repeated')
    expect(out.rowErrors[4]).toEqual({})
  })

  it('refuses more rows than the schema allows', () => {
    const many = Array.from({ length: HEAD_TABLE_MAX_ROWS + 1 }, (_, i) => [String(i), '1'] as [string, string])
    expect(checkHeadRows(rows(...many)).tableError).toMatch(/50 rows at most; this one has 51/)
    expect(checkHeadRows(rows(...many.slice(0, HEAD_TABLE_MAX_ROWS))).table).toHaveLength(HEAD_TABLE_MAX_ROWS)
  })

  it('agrees with the server schema on which tables are acceptable', () => {
    const cell = fc.constantFrom('0', '0.5', '1', '2', '2', '19.9', '20', '20.01', '-1', '1e3')
    const table = fc.array(fc.tuple(cell, cell), { maxLength: 6 })
    fc.assert(
      fc.property(table, (pairs) => {
        const ours = checkHeadRows(rows(...pairs)).table !== null
        const theirs = HeadTableSchema.safeParse(pairs.map(([flow, head]) => ({ flow: Number(flow), head: Number(head) }))).success
        expect(ours, JSON.stringify(pairs)).toBe(theirs)
      }),
      { numRuns: 400 },
    )
    const tooMany = Array.from({ length: HEAD_TABLE_MAX_ROWS + 1 }, (_, i) => ({ flow: i, head: 1 }))
    expect(HeadTableSchema.safeParse(tooMany).success).toBe(false)
  })
})

describe('head table rows', () => {
  it('makes rows from a stored table, sorts by flow with blanks last, and tells unsaved changes by the texts', () => {
    const made = headRowsFrom([{ flow: 30, head: 0.85 }, { flow: 1, head: 1.35 }])
    expect(made.map((r) => [r.flow, r.head])).toEqual([['30', '0.85'], ['1', '1.35']])
    expect(new Set([...made, blankHeadRow()].map((r) => r.key)).size).toBe(3)
    const sorted = sortHeadRows([...made, { ...blankHeadRow(), head: '2' }, ...rows(['5', '1.3'])])
    expect(sorted.map((r) => r.flow)).toEqual(['1', '5', '30', ''])
    expect(headTableText(made)).toBe(headTableText(rows(['30 ', '0.85'], [' 1', '1.35'])))
    expect(headTableText(made)).not.toBe(headTableText(rows(['30', '0.86'], ['1', '1.35'])))
  })

  it('maps server issues on headTable.N.cell onto rows and the rest onto the table', () => {
    const out = headRowErrorsFromIssues({ 'headTable.1.flow': 'rows must be sorted by rising flow', headTable: 'may have 50 rows at most', 'fdcPoints.0.flow': 'ignored', 'headTable.7.head': 'beyond' }, 2)
    expect(out.rowErrors).toEqual([{}, { flow: 'rows must be sorted by rising flow' }])
    expect(out.tableError).toBe('may have 50 rows at most')
  })
})
