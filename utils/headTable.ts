// The head-vs-flow table of a site's weir: rows of river flow (m³/s) and gross head (m), edited as
// text with the table helpers of numberTable.ts and checked as HeadTableSchema (shared/schemas/site.ts)
// will check them. Pure, so the unit tests can drive it.
import { MAX_GROSS_HEAD_M, type HeadRow } from '#shared/schemas/site'
import { blankRowOf, cellError, type CellRule, parseTypedNumber, rowErrorsFromIssues, rowsFromValues, rowsText, sortRowsBy, type TableRow, type TableRowErrors } from './numberTable'

export const HEAD_COLUMNS = ['flow', 'head'] as const

export type HeadColumn = (typeof HEAD_COLUMNS)[number]

/** One editable row of the head table. */
export type HeadTableRow = TableRow<HeadColumn>

/** Messages for one row's cells. */
export type HeadRowError = TableRowErrors<HeadColumn>

/** Most rows the table may have (as HeadTableSchema). */
export const HEAD_TABLE_MAX_ROWS = 50

const FLOW_RULE: CellRule = { name: 'river flow', unit: 'm³/s', min: 0 }

const HEAD_RULE: CellRule = { name: 'head', unit: 'm', min: 0, max: MAX_GROSS_HEAD_M }

/** The outcome of checking the table. */
export interface HeadTableCheck {
  /** One entry per row, same order as the rows. */
  rowErrors: HeadRowError[]
  /** A message about the table as a whole (too many rows), or ''. */
  tableError: string
  /** The rows ready to send, or null while any error stands. An empty table is fine: the weir's gross head then holds at every flow. */
  table: HeadRow[] | null
}

/** Editable rows for a stored table. */
export function headRowsFrom(table: readonly HeadRow[] | null | undefined): HeadTableRow[] {
  return rowsFromValues(table, HEAD_COLUMNS)
}

/** A blank row. */
export function blankHeadRow(): HeadTableRow {
  return blankRowOf(HEAD_COLUMNS)
}

/** Rows by rising river flow; blank or non-numeric flows go last. */
export function sortHeadRows(rows: readonly HeadTableRow[]): HeadTableRow[] {
  return sortRowsBy(rows, 'flow')
}

/** The rows' texts as one string, to tell whether the table has unsaved changes. */
export function headTableText(rows: readonly HeadTableRow[]): string {
  return rowsText(rows, HEAD_COLUMNS)
}

/**
 * Checks every row: river flow 0 m³/s or more, rising down the table without repeats; head from 0 to
 * MAX_GROSS_HEAD_M m (0 is allowed: a weir drowned out in a flood has no head); 50 rows at most.
 */
export function checkHeadRows(rows: readonly HeadTableRow[]): HeadTableCheck {
  const parsed = rows.map((r) => ({ flow: parseTypedNumber(r.flow), head: parseTypedNumber(r.head) }))
  const rowErrors: HeadRowError[] = parsed.map((p) => {
    const e: HeadRowError = {}
    const flow = cellError(p.flow, FLOW_RULE)
    const head = cellError(p.head, HEAD_RULE)
    if (flow) e.flow = flow
    if (head) e.head = head
    return e
  })

  // Each flow is compared with the nearest earlier row whose flow is itself valid.
  let prevFlow: number | null = null
  parsed.forEach((p, i) => {
    const e = rowErrors[i]!
    if (e.flow || p.flow === null) return
    if (prevFlow !== null && p.flow <= prevFlow) e.flow = p.flow === prevFlow ? 'This river flow is repeated' : 'River flow must rise down the table (sort the rows)'
    else prevFlow = p.flow
  })

  const tableError = rows.length > HEAD_TABLE_MAX_ROWS ? `The head table may have ${HEAD_TABLE_MAX_ROWS} rows at most; this one has ${rows.length}.` : ''
  const clean = !tableError && rowErrors.every((e) => !e.flow && !e.head)
  return { rowErrors, tableError, table: clean ? parsed.map((p) => ({ flow: p.flow as number, head: p.head as number })) : null }
}

/** Server issues such as `headTable.2.flow` mapped onto the rows; anything else under `headTable` as the table message. */
export function headRowErrorsFromIssues(fields: Record<string, string>, rowCount: number) {
  return rowErrorsFromIssues(fields, rowCount, 'headTable', HEAD_COLUMNS)
}
