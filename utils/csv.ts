// CSV text built in the browser (quoted cells, a file name) and its download.
import Papa from 'papaparse'

/** One cell of a CSV row: null and non-finite numbers become empty cells. */
export type CsvCell = string | number | null | undefined

/** A number written without float noise (12 significant figures, e.g. 0.30000000000000004 → 0.3); others unchanged. */
export function csvCell(value: CsvCell): string | number | null {
  if (value === undefined || value === null) return null
  if (typeof value === 'number') return Number.isFinite(value) ? Number(value.toPrecision(12)) : null
  return value
}

/** CSV text: the header row, then one line per row (CRLF line ends, RFC 4180). */
export function csvText(columns: readonly string[], rows: readonly (readonly CsvCell[])[]): string {
  const text = Papa.unparse({ fields: [...columns], data: rows.map((r) => r.map(csvCell)) }, { newline: '\r\n' })
  return text.endsWith('\r\n') ? text : `${text}\r\n`
}

/** A file name of the site and table, e.g. `Cragg-Foot-drop-head-table.csv` (the server names the daily record the same way). */
export function csvFileName(siteName: string, table: string): string {
  const safe = siteName.trim().replace(/[^\p{L}\p{N}]+/gu, '-').replace(/^-+|-+$/g, '') || 'site'
  return `${safe}-${table}.csv`
}

/** Hands the table to the browser as a CSV file download. Browser only. */
export function downloadCsv(fileName: string, columns: readonly string[], rows: readonly (readonly CsvCell[])[]): void {
  const blob = new Blob([csvText(columns, rows)], { type: 'text/csv;charset=utf-8' })
  const url = URL.createObjectURL(blob)
  const link = document.createElement('a')
  link.href = url
  link.download = fileName
  link.style.display = 'none'
  document.body.appendChild(link)
  link.click()
  link.remove()
  // The browser has taken the file once the click is handled; free the memory after that.
  setTimeout(() => URL.revokeObjectURL(url), 1000)
}
