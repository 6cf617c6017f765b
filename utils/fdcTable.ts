// The entered flow-duration curve as a table of typed numbers (utils/numberTable.ts): its columns,
// rules and checks.
import { blankRowOf, cellError, type CellRule, parseTypedNumber, rowErrorsFromIssues, rowsFromValues, sortRowsBy, type TableRow, type TableRowErrors } from './numberTable'

/** One FDC point as the API stores it: flow equalled or exceeded `exceedance` % of the time. */
export interface FdcPointValue {
  /** Exceedance, % of time, 0–100. */
  exceedance: number
  /** Flow, m³/s, 0 or more. */
  flow: number
}

export const FDC_COLUMNS = ['exceedance', 'flow'] as const

export type FdcColumn = (typeof FDC_COLUMNS)[number]

/** One editable FDC row. */
export type FdcRow = TableRow<FdcColumn>

/** Messages for one FDC row's cells. */
export type FdcRowError = TableRowErrors<FdcColumn>

/** The outcome of checking the table. */
export interface FdcCheck {
  /** One entry per row, same order as the rows. */
  rowErrors: FdcRowError[]
  /** A message about the table as a whole (too few points), or ''. */
  tableError: string
  /** The points ready to send, or null while any error stands. */
  points: FdcPointValue[] | null
}

/** Fewest points an FDC may have. */
export const FDC_MIN_POINTS = 3

const EXCEEDANCE_RULE: CellRule = { name: 'exceedance', unit: '%', min: 0, max: 100 }

const FDC_FLOW_RULE: CellRule = { name: 'flow', unit: 'm³/s', min: 0 }

/** Editable rows for stored points. */
export function rowsFromPoints(points: readonly FdcPointValue[] | null | undefined): FdcRow[] {
  return rowsFromValues(points, FDC_COLUMNS)
}

/** A blank FDC row. */
export function blankRow(): FdcRow {
  return blankRowOf(FDC_COLUMNS)
}

/** Rows in order of rising exceedance; rows whose exceedance is blank or not a number go last, in their order. */
export function sortRows(rows: readonly FdcRow[]): FdcRow[] {
  return sortRowsBy(rows, 'exceedance')
}

/**
 * Checks every row: exceedance 0–100 %, flow 0 or more m³/s, exceedance rising without repeats,
 * flow not rising as exceedance rises, and at least three points (or none, with `allowEmpty`:
 * saving an empty table removes the entered curve).
 */
export function checkFdcRows(rows: readonly FdcRow[], options: { allowEmpty?: boolean } = {}): FdcCheck {
  const parsed = rows.map((r) => ({ exceedance: parseTypedNumber(r.exceedance), flow: parseTypedNumber(r.flow) }))
  const rowErrors: FdcRowError[] = parsed.map((p) => {
    const e: FdcRowError = {}
    const exceedance = cellError(p.exceedance, EXCEEDANCE_RULE)
    const flow = cellError(p.flow, FDC_FLOW_RULE)
    if (exceedance) e.exceedance = exceedance
    if (flow) e.flow = flow
    return e
  })

  // Order checks compare each row with the nearest earlier row whose cell is itself valid.
  let prevExceedance: number | null = null
  let prevFlow: number | null = null
  parsed.forEach((p, i) => {
    const e = rowErrors[i]!
    if (!e.exceedance && p.exceedance !== null) {
      if (prevExceedance !== null && p.exceedance <= prevExceedance) {
        e.exceedance = p.exceedance === prevExceedance ? 'This exceedance is repeated' : 'Exceedance must rise down the table (sort the rows)'
      } else prevExceedance = p.exceedance
    }
    if (!e.flow && p.flow !== null) {
      if (prevFlow !== null && p.flow > prevFlow) e.flow = 'Flow must not rise as exceedance rises'
      else prevFlow = p.flow
    }
  })

  const tooFew = rows.length < FDC_MIN_POINTS && !(options.allowEmpty && rows.length === 0)
  const tableError = tooFew ? `An FDC needs at least ${FDC_MIN_POINTS} points; this table has ${rows.length}.` : ''
  const clean = !tableError && rowErrors.every((e) => !e.exceedance && !e.flow)
  return {
    rowErrors,
    tableError,
    points: clean ? parsed.map((p) => ({ exceedance: p.exceedance as number, flow: p.flow as number })) : null,
  }
}

/** The server's issues under `fdcPoints` mapped onto the FDC rows; anything else there is the table message. */
export function fdcRowErrorsFromIssues(fields: Record<string, string>, rowCount: number): { rowErrors: FdcRowError[]; tableError: string } {
  return rowErrorsFromIssues(fields, rowCount, 'fdcPoints', FDC_COLUMNS)
}
