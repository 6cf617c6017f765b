import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import { csvCell, csvFileName, csvText } from '../../../utils/csv'

describe('csvText', () => {
  it('writes the header with units, one CRLF line per row, gaps as empty cells', () => {
    const text = csvText(['date', 'flow_m3s'], [['2020-01-01', 2.5], ['2020-01-02', null], ['2020-01-03', Number.NaN]])
    expect(text).toBe('date,flow_m3s\r\n2020-01-01,2.5\r\n2020-01-02,\r\n2020-01-03,\r\n')
  })

  it('writes only the header for an empty table, and quotes cells that need it (RFC 4180)', () => {
    expect(csvText(['flow_m3s', 'gross_head_m'], [])).toBe('flow_m3s,gross_head_m\r\n')
    const text = csvText(['month', 'note'], [['May', 'dry, then "wet"']])
    expect(text).toBe('month,note\r\nMay,"dry, then ""wet"""\r\n')
    expect(Papa.parse(text.trim()).data).toEqual([['month', 'note'], ['May', 'dry, then "wet"']])
  })

  it('drops float noise but keeps real precision', () => {
    expect(csvCell(0.1 + 0.2)).toBe(0.3)
    expect(csvCell(2.7500000000000004)).toBe(2.75)
    expect(csvCell(0.000123456789)).toBe(0.000123456789)
    expect(csvCell(undefined)).toBeNull()
    expect(csvCell(Infinity)).toBeNull()
    expect(csvCell('%sat')).toBe('%sat')
  })
})

describe('csvFileName', () => {
  it('names the file after the site and the table, safe for any file system', () => {
    expect(csvFileName('Cragg Foot drop', 'head-table')).toBe('Cragg-Foot-drop-head-table.csv')
    expect(csvFileName(' Ållerby / "old" mill ', 'months')).toBe('Ållerby-old-mill-months.csv')
    expect(csvFileName('***', 'fdc-points')).toBe('site-fdc-points.csv')
  })
})
