// Table editors of typed numbers (the FDC points, the head-vs-flow table), kept pure so they can be
// unit-tested: rows are edited as text, each cell checked against a rule with its unit, rows sorted
// by a column, and the server's per-row issues mapped back onto the cells.
/** One editable row of a table whose columns are `C`; the texts are what the user typed. */
export type TableRow<C extends string> = { key: number } & Record<C, string>

/** Messages for one row's cells. */
export type TableRowErrors<C extends string> = Partial<Record<C, string>>

/** One column of a table editor (components/form/FormNumberTable.vue). */
export interface NumberTableColumn<C extends string> {
  /** The row field the column edits; also ends the cell ids (`fdc-0-flow`). */
  key: C
  /** Column heading with its unit, e.g. "Flow (m³/s)". */
  heading: string
  /** Unit shown after each cell. */
  unit: string
  /** Name of the cell in its accessible label: "Row 3 <label>". */
  cellLabel: string
}

/** What a cell must hold: its name in messages, its unit and its range (inclusive). */
export interface CellRule {
  /** Lower-case name used in messages, e.g. "flow". */
  name: string
  /** Unit written after numbers in messages, e.g. "m³/s". */
  unit: string
  min?: number
  max?: number
}

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

/** Editable rows for stored values, one text per column. */
export function rowsFromValues<C extends string>(values: readonly Readonly<Record<C, number>>[] | null | undefined, columns: readonly C[]): TableRow<C>[] {
  return (values ?? []).map((v) => {
    const row = { key: newRowKey() } as TableRow<C>
    for (const c of columns) (row as Record<C, string>)[c] = String(v[c])
    return row
  })
}

/** A blank row of the given columns. */
export function blankRowOf<C extends string>(columns: readonly C[]): TableRow<C> {
  const row = { key: newRowKey() } as TableRow<C>
  for (const c of columns) (row as Record<C, string>)[c] = ''
  return row
}

/** Rows by rising `column`; rows whose cell is blank or not a number go last, in their order. */
export function sortRowsBy<C extends string>(rows: readonly TableRow<C>[], column: NoInfer<C>): TableRow<C>[] {
  const valueOf = (r: TableRow<C>) => {
    const v = parseTypedNumber(r[column])
    return v === null || Number.isNaN(v) ? Infinity : v
  }
  return rows
    .map((row, index) => ({ row, index, v: valueOf(row) }))
    .sort((a, b) => a.v - b.v || a.index - b.index)
    .map((x) => x.row)
}

/** The texts of the rows, trimmed, as one string: two tables with equal texts are equal (for "unsaved changes"). */
export function rowsText<C extends string>(rows: readonly TableRow<C>[], columns: readonly C[]): string {
  return JSON.stringify(rows.map((r) => columns.map((c) => r[c].trim())))
}

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1)

/** The message for one parsed cell under `rule`, or undefined when it is fine. */
export function cellError(value: number | null, rule: CellRule): string | undefined {
  const name = capital(rule.name)
  if (value === null) return `Enter the ${rule.name}, ${rule.unit}`
  if (Number.isNaN(value)) return `${name} must be a number`
  const { min, max, unit } = rule
  if (min !== undefined && max !== undefined && (value < min || value > max)) return `${name} must be between ${min} and ${max} ${unit}`
  if (min !== undefined && value < min) return `${name} must be ${min} ${unit} or more`
  if (max !== undefined && value > max) return `${name} must be ${max} ${unit} or less`
  return undefined
}

/**
 * Server issues such as `fdcPoints.2.flow` (prefix `fdcPoints`) mapped onto row errors for `columns`; anything else under
 * `prefix` (e.g. `fdcPoints` itself) comes back as the table message.
 */
export function rowErrorsFromIssues<C extends string>(
  fields: Record<string, string>,
  rowCount: number,
  prefix: string,
  columns: readonly C[],
): { rowErrors: TableRowErrors<C>[]; tableError: string } {
  const rowErrors: TableRowErrors<C>[] = Array.from({ length: rowCount }, () => ({}))
  let tableError = ''
  for (const [path, message] of Object.entries(fields)) {
    if (path !== prefix && !path.startsWith(`${prefix}.`)) continue
    const [index, cell] = path.slice(prefix.length + 1).split('.')
    const i = Number(index)
    if (index !== '' && Number.isInteger(i) && i >= 0 && i < rowCount && (columns as readonly string[]).includes(cell ?? '')) rowErrors[i]![cell as C] = message
    else tableError ||= message
  }
  return { rowErrors, tableError }
}
