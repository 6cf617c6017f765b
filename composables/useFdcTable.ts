// The flow-duration-curve table editor's rules, kept pure so they can be unit-tested:
// rows are edited as text, checked row by row, and turned into FDC points for the PATCH.

/** One FDC point as the API stores it: flow equalled or exceeded `exceedance` % of the time. */
export interface FdcPointValue {
  /** Exceedance, % of time, 0–100. */
  exceedance: number
  /** Flow, m³/s, 0 or more. */
  flow: number
}

/** One editable row; the texts are what the user typed. */
export interface FdcRow {
  /** Stable key for v-for while rows move. */
  key: number
  exceedance: string
  flow: string
}

/** Messages for one row's cells. */
export interface FdcRowError {
  exceedance?: string
  flow?: string
}

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

let nextKey = 1
/** A fresh key for a new row. */
export function newRowKey(): number {
  return nextKey++
}

/** A number from typed text: null when blank, NaN when not a number. Accepts a decimal comma. */
export function parseTypedNumber(text: string | number | null | undefined): number | null {
  if (text === null || text === undefined) return null
  if (typeof text === 'number') return text
  const t = text.trim().replace(',', '.')
  if (t === '') return null
  return /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t) ? Number(t) : Number.NaN
}

/** Editable rows for stored points. */
export function rowsFromPoints(points: readonly FdcPointValue[] | null | undefined): FdcRow[] {
  return (points ?? []).map((p) => ({ key: newRowKey(), exceedance: String(p.exceedance), flow: String(p.flow) }))
}

/** A blank row. */
export function blankRow(): FdcRow {
  return { key: newRowKey(), exceedance: '', flow: '' }
}

/** Rows in order of rising exceedance; rows whose exceedance is blank or not a number go last, in their order. */
export function sortRows(rows: readonly FdcRow[]): FdcRow[] {
  const valueOf = (r: FdcRow) => {
    const v = parseTypedNumber(r.exceedance)
    return v === null || Number.isNaN(v) ? Infinity : v
  }
  return rows
    .map((row, index) => ({ row, index, v: valueOf(row) }))
    .sort((a, b) => a.v - b.v || a.index - b.index)
    .map((x) => x.row)
}

/**
 * Checks every row: exceedance 0–100 %, flow 0 or more m³/s, exceedance rising without repeats,
 * flow not rising as exceedance rises, and at least three points (or none, with `allowEmpty`:
 * saving an empty table removes the entered curve).
 */
export function checkFdcRows(rows: readonly FdcRow[], options: { allowEmpty?: boolean } = {}): FdcCheck {
  const rowErrors: FdcRowError[] = rows.map(() => ({}))
  const parsed = rows.map((r) => ({ exceedance: parseTypedNumber(r.exceedance), flow: parseTypedNumber(r.flow) }))

  parsed.forEach((p, i) => {
    const e = rowErrors[i]!
    if (p.exceedance === null) e.exceedance = 'Enter the exceedance, %'
    else if (Number.isNaN(p.exceedance)) e.exceedance = 'Exceedance must be a number'
    else if (p.exceedance < 0 || p.exceedance > 100) e.exceedance = 'Exceedance must be between 0 and 100 %'
    if (p.flow === null) e.flow = 'Enter the flow, m³/s'
    else if (Number.isNaN(p.flow)) e.flow = 'Flow must be a number'
    else if (p.flow < 0) e.flow = 'Flow must be 0 m³/s or more'
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

/**
 * Server issues such as `fdcPoints.2.flow` mapped onto row errors; anything else about the
 * points (e.g. `fdcPoints`) comes back as the table message.
 */
export function rowErrorsFromIssues(fields: Record<string, string>, rowCount: number, prefix = 'fdcPoints'): { rowErrors: FdcRowError[]; tableError: string } {
  const rowErrors: FdcRowError[] = Array.from({ length: rowCount }, () => ({}))
  let tableError = ''
  for (const [path, message] of Object.entries(fields)) {
    if (path !== prefix && !path.startsWith(`${prefix}.`)) continue
    const [, index, cell] = path.split('.')
    const i = Number(index)
    if (Number.isInteger(i) && i >= 0 && i < rowCount && (cell === 'exceedance' || cell === 'flow')) rowErrors[i]![cell] = message
    else tableError ||= message
  }
  return { rowErrors, tableError }
}
