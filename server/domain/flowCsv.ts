// Longer than most files: the CSV rules (separators, date forms, gaps, flags, columns) are one job, each with its refusal.
// Reading a gauged daily flow record from CSV text: pure, no Nitro, no database, so it is unit-tested
// in tests/unit/sites/. The route (server/api/sites/[id]/flow-record.post.ts) does the rest.
//
// Rules (also in docs/api.md):
// - The first line that is neither blank nor a `#` comment is the header row; its delimiter, comma,
//   semicolon or tab, is whichever it holds most of. With semicolons a decimal comma is accepted (`2,5`).
// - Columns come from the caller (`dateColumn`, `flowColumn`, matched case-insensitively) or by name:
//   date/day/datum/time…, flow/discharge/q/m3s…; with two columns, one a date, the other is the flow.
//   Anything else is ambiguous and the caller must choose.
// - Dates: ISO `YYYY-MM-DD` or day-first `DD/MM/YYYY`, `DD.MM.YYYY`, `DD-MM-YYYY`, each optionally
//   followed by a time of day, which is ignored. `auto` takes the form of the first date and holds
//   every line to it.
// - Gaps (stored as null): a blank flow, `-`, `NA`, `N/A`, `NaN`, `null`, `none`, `missing`, `M`;
//   a value flagged suspect by a trailing `*`, `?` or `!` (`12.3*`); or a line whose flag column
//   (flag, qualifier, quality, qc, code or status) holds anything but blank or a good/estimated code
//   (G, good, OK, A, approved, V, valid, E, estimated).
// - Bad lines, every one reported by its line number in the file: a flow that is text, negative or
//   implausibly large; a missing, malformed or impossible date; a day given twice; too few fields;
//   in append mode, a day already stored.
// - A refusal never echoes much of the file: a cell quoted in a reason is cut to 100 characters, a
//   header name may be 200 characters at most, and the first 1,000 bad lines are listed (all are
//   counted). A file of more than 160,000 lines, or a header of more than 100 columns, is refused
//   unparsed.
// Longer than most files: one parser with its date, number, column and per-line error rules, which share state.
import Papa from 'papaparse'

export type CsvDateFormat = 'iso' | 'day-first'

/** One bad line: `line` counts from 1 at the top of the file. */
export interface CsvLineError {
  line: number
  reason: string
}

export interface ParsedDay {
  date: string
  flow: number | null
}

export interface FlowCsvOptions {
  dateColumn?: string
  flowColumn?: string
  dateFormat?: 'auto' | CsvDateFormat
  /** Days already stored: each one in the file is an error (append mode). */
  existingDays?: ReadonlySet<string>
  /** Most data lines accepted. */
  maxDays?: number
}

export type FlowCsvResult =
  | {
      ok: true
      /** Sorted by date. */
      days: ParsedDay[]
      header: string[]
      dateColumn: string
      flowColumn: string
      flagColumn: string | null
      dateFormat: CsvDateFormat
      delimiter: ',' | ';' | '\t'
      gaps: number
      flagged: number
    }
  | { ok: false; kind: 'columns'; header: string[]; message: string }
  /** `errors` lists the first MAX_LISTED_ERRORS bad lines; `errorCount` counts them all. */
  | { ok: false; kind: 'lines'; errors: CsvLineError[]; errorCount: number; message: string }

/** Largest daily flow taken as real, m³/s (beyond any river's recorded flood). */
export const MAX_PLAUSIBLE_FLOW = 1_000_000
/**
 * Most lines read from a file, blank lines and comments included: room for the most days a record
 * may hold (MAX_FLOW_DAYS, 80,000) and as many blank or comment lines again. Checked before parsing,
 * since each line costs far more memory parsed than as text (10 MB of empty lines took 800 MB).
 */
export const MAX_LINES = 160_000
/** Most fields on one line: a flow file needs a handful. */
export const MAX_FIELDS = 100
/** Bad lines listed in a refusal (all are counted). */
export const MAX_LISTED_ERRORS = 1000
/** Longest column name accepted in the header row, characters. */
export const MAX_HEADER_CELL = 200
/** Longest part of a cell quoted back in a reason, characters. */
const MAX_QUOTED = 100

/** A cell as quoted in a reason: trimmed, and cut to MAX_QUOTED characters with its length said. */
export function quoted(text: string): string {
  const t = text.trim()
  return t.length > MAX_QUOTED ? `${t.slice(0, MAX_QUOTED)}… (${t.length.toLocaleString('en-GB')} characters)` : t
}

const DATE_WORDS = new Set(['date', 'day', 'datum', 'dato', 'fecha', 'time', 'datetime', 'timestamp', 'dates', 'days'])
const FLOW_WORDS = new Set(['flow', 'flows', 'discharge', 'q', 'qmean', 'm3s', 'm3/s', 'streamflow', 'abfluss', 'debit', 'caudal', 'portata', 'cumecs'])
const FLAG_WORDS = new Set(['flag', 'flags', 'qualifier', 'qualifiers', 'quality', 'qc', 'code', 'status'])
const GAP_WORDS = new Set(['', '-', '--', '—', 'na', 'n/a', 'nan', 'null', 'none', 'missing', 'm'])
const GOOD_FLAGS = new Set(['', 'g', 'good', 'ok', 'a', 'approved', 'v', 'valid', 'e', 'est', 'estimated'])

const TIME = String.raw`(?:[T ]\d{1,2}:\d{2}(?::\d{2}(?:\.\d+)?)?\s*(?:Z|[+-]\d{2}:?\d{2})?)?`
const ISO_RE = new RegExp(String.raw`^(\d{4})-(\d{1,2})-(\d{1,2})${TIME}$`)
const DAY_FIRST_RE = new RegExp(String.raw`^(\d{1,2})([/.\-])(\d{1,2})\2(\d{4})${TIME}$`)
const NUMBER_RE = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?$/i
const FLAGGED_RE = /^(.*?\d)\s*[*?!]+$/

const pad = (n: number) => String(n).padStart(2, '0')
const isLeap = (y: number) => (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0
const daysIn = (y: number, m: number) => [31, isLeap(y) ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][m - 1] ?? 0

/** Which form a date is written in, or null when it is neither (no calendar check). */
export function dateFormatOf(text: string): CsvDateFormat | null {
  const t = text.trim()
  if (ISO_RE.test(t)) return 'iso'
  if (DAY_FIRST_RE.test(t)) return 'day-first'
  return null
}

/** A calendar date written ISO (`YYYY-MM-DD`) or day-first (`DD/MM/YYYY`, `DD.MM.YYYY`), as YYYY-MM-DD; or why not. */
export function parseDay(text: string, format: CsvDateFormat): { date: string } | { error: string } {
  const t = text.trim()
  if (!t) return { error: 'the date is missing' }
  const q = quoted(t)
  let y: number, m: number, d: number
  if (format === 'iso') {
    const r = ISO_RE.exec(t)
    if (!r) {
      return { error: DAY_FIRST_RE.test(t) ? `date "${q}" is day-first; this file's dates are written YYYY-MM-DD` : `"${q}" is not a date written YYYY-MM-DD` }
    }
    ;[y, m, d] = [Number(r[1]), Number(r[2]), Number(r[3])]
  } else {
    const r = DAY_FIRST_RE.exec(t)
    if (!r) {
      return { error: ISO_RE.test(t) ? `date "${q}" is written YYYY-MM-DD; this file's dates are day-first (DD/MM/YYYY)` : `"${q}" is not a date written DD/MM/YYYY or DD.MM.YYYY` }
    }
    ;[d, m, y] = [Number(r[1]), Number(r[3]), Number(r[4])]
  }
  if (y < 1800 || y > 2200) return { error: `date "${q}": year ${y} is out of range (1800–2200)` }
  if (m < 1 || m > 12) {
    const hint = format === 'day-first' && d <= 12 ? ' (dates must be day-first: DD/MM/YYYY)' : ''
    return { error: `date "${q}": there is no month ${m}${hint}` }
  }
  if (d < 1 || d > daysIn(y, m)) return { error: `date "${q}" does not exist (month ${m} of ${y} has ${daysIn(y, m)} days)` }
  return { date: `${y}-${pad(m)}-${pad(d)}` }
}

/** A flow cell read as m³/s: a number, a gap (null, `flagged` when a marker said suspect), or why not. */
export function parseFlowCell(text: string, decimalComma: boolean): { flow: number | null; flagged: boolean } | { error: string } {
  let t = text.trim()
  if (GAP_WORDS.has(t.toLowerCase())) return { flow: null, flagged: false }
  const flaggedMatch = FLAGGED_RE.exec(t)
  if (flaggedMatch) t = flaggedMatch[1]!.trim()
  const normal = decimalComma && /^[^,]*,[^,]*$/.test(t) && !t.includes('.') ? t.replace(',', '.') : t
  if (!NUMBER_RE.test(normal)) return { error: `flow "${quoted(text)}" is not a number` }
  const q = Number(normal)
  if (q < 0) return { error: `flow ${quoted(text)} is negative` }
  if (q > MAX_PLAUSIBLE_FLOW) return { error: `flow ${quoted(text)} m³/s is not plausible` }
  if (flaggedMatch) return { flow: null, flagged: true }
  return { flow: q, flagged: false }
}

/** Header cell as words: lower case, units in brackets dropped, m³ written m3. */
function words(cell: string): string[] {
  const t = cell
    .toLowerCase()
    .replace(/³/g, '3')
    .replace(/[([{].*?[)\]}]/g, ' ')
    .replace(/m3\s*\/\s*s/g, ' m3s ')
    .replace(/[^a-z0-9]+/g, ' ')
    .trim()
  return t ? t.split(' ') : []
}

const matches = (cell: string, vocabulary: Set<string>) => words(cell).some((w) => vocabulary.has(w))

function pickDelimiter(line: string): ',' | ';' | '\t' {
  const count = (c: string) => line.split(c).length - 1
  const semi = count(';')
  const comma = count(',')
  const tab = count('\t')
  if (tab > semi && tab > comma) return '\t'
  return semi > 0 && semi >= comma ? ';' : ','
}

/** Turns bytes into text: UTF-8 (BOM dropped), UTF-16 with a BOM, else Windows-1252; null for binary data. */
export function decodeCsvBytes(bytes: Uint8Array): string | null {
  let text: string
  if (bytes[0] === 0xff && bytes[1] === 0xfe) text = new TextDecoder('utf-16le').decode(bytes.subarray(2))
  else if (bytes[0] === 0xfe && bytes[1] === 0xff) text = new TextDecoder('utf-16be').decode(bytes.subarray(2))
  else {
    try {
      text = new TextDecoder('utf-8', { fatal: true }).decode(bytes)
    } catch {
      text = new TextDecoder('windows-1252').decode(bytes)
    }
  }
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1)
  if (text.includes('\u0000')) return null
  return text
}

interface RawRow {
  cells: string[]
  line: number
}

/** Rows of the text with the line each starts on; blank lines and `#` comments left out. */
function readRows(text: string, delimiter: string): RawRow[] {
  return text.includes('"') ? readQuotedRows(text, delimiter) : readPlainRows(text, delimiter)
}

/**
 * A text without a quote character: papaparse parses it whole in its fast mode, which splits on line
 * ends and then on the delimiter, so data row i is line i + 1 and no line needs counting. A `#` comment
 * (a line starting with `#`, as papaparse's `comments` option reads it) is a row whose first cell starts so.
 */
function readPlainRows(text: string, delimiter: string): RawRow[] {
  const { data } = Papa.parse<string[]>(text, { delimiter, newline: '\n', skipEmptyLines: false, comments: false })
  const rows: RawRow[] = []
  for (let i = 0; i < data.length; i++) {
    const cells = data[i]!
    const first = cells[0] ?? ''
    if (first.charCodeAt(0) === 35 /* # */ || (cells.length === 1 && first.trim() === '')) continue
    rows.push({ cells, line: i + 1 })
  }
  return rows
}

/**
 * A text with quoted fields, which may hold line breaks: papaparse row by row, each row's line worked
 * out from where it ends (line breaks up to there, less those inside its cells).
 */
function readQuotedRows(text: string, delimiter: string): RawRow[] {
  const rows: RawRow[] = []
  let scanned = 0
  let newlines = 0
  Papa.parse<string[]>(text, {
    delimiter,
    newline: '\n',
    skipEmptyLines: false,
    comments: '#',
    step: (result) => {
      const cells = result.data
      const end = result.meta.cursor
      const contentEnd = text[end - 1] === '\n' ? end - 1 : end
      for (let i = text.indexOf('\n', scanned); i !== -1 && i < contentEnd; i = text.indexOf('\n', i + 1)) newlines++
      if (contentEnd > scanned) scanned = contentEnd
      let inside = 0
      for (const c of cells) {
        if (!c.includes('\n')) continue
        for (let i = c.indexOf('\n'); i !== -1; i = c.indexOf('\n', i + 1)) inside++
      }
      const line = newlines + 1 - inside
      if (cells.length === 1 && cells[0]!.trim() === '') return
      rows.push({ cells, line })
    },
  })
  return rows
}

/** `max + 1` when the text has more than `max` lines (a last line end starts no new line), else null. */
function lineAfter(text: string, max: number): number | null {
  let lines = 1
  for (let i = text.indexOf('\n'); i !== -1 && i < text.length - 1; i = text.indexOf('\n', i + 1)) {
    if (++lines > max) return lines
  }
  return null
}

/** The first line that is neither blank nor a `#` comment and its number, or '' (without splitting the whole text). */
function firstContentLine(text: string): { text: string; line: number } {
  let line = 1
  for (let start = 0; start <= text.length; line++) {
    const nl = text.indexOf('\n', start)
    const end = nl === -1 ? text.length : nl
    const content = text.slice(start, end)
    if (content.trim() !== '' && !content.trimStart().startsWith('#')) return { text: content, line }
    start = end + 1
  }
  return { text: '', line: 1 }
}

/** The number written by the ASCII digits t[from..to), or -1 when any is not a digit. */
function digitsAt(t: string, from: number, to: number): number {
  let n = 0
  for (let i = from; i < to; i++) {
    const c = t.charCodeAt(i) - 48
    if (c < 0 || c > 9) return -1
    n = n * 10 + c
  }
  return n
}

/**
 * A date cell already in its plainest form, `YYYY-MM-DD` or `DD/MM/YYYY` (`.` or `-` alike) with no
 * time and no space, and a real calendar day: its YYYY-MM-DD; null sends it to parseDay, which
 * reads every other form and words every error.
 */
function plainDay(t: string, format: CsvDateFormat): string | null {
  if (t.length !== 10) return null
  let y: number, m: number, d: number
  if (format === 'iso') {
    if (t.charCodeAt(4) !== 45 || t.charCodeAt(7) !== 45) return null
    ;[y, m, d] = [digitsAt(t, 0, 4), digitsAt(t, 5, 7), digitsAt(t, 8, 10)]
  } else {
    const sep = t.charCodeAt(2)
    if ((sep !== 47 && sep !== 46 && sep !== 45) || t.charCodeAt(5) !== sep) return null
    ;[d, m, y] = [digitsAt(t, 0, 2), digitsAt(t, 3, 5), digitsAt(t, 6, 10)]
  }
  if (y < 1800 || y > 2200 || m < 1 || m > 12 || d < 1 || d > daysIn(y, m)) return null
  return format === 'iso' ? t : `${t.slice(6, 10)}-${t.slice(3, 5)}-${t.slice(0, 2)}`
}

/**
 * A flow cell that is blank (a gap: null) or a plain unsigned decimal (`12`, `3.25`, `.5`; `2,5` in a
 * semicolon file) no larger than MAX_PLAUSIBLE_FLOW; undefined sends it to parseFlowCell, which
 * reads every other form (spaces, signs, exponents, gap words, flags) and words every error.
 */
function plainFlow(t: string, decimalComma: boolean): number | null | undefined {
  if (t.length === 0) return null
  let digits = 0
  let points = 0
  let comma = -1
  for (let i = 0; i < t.length; i++) {
    const c = t.charCodeAt(i)
    if (c >= 48 && c <= 57) digits++
    else if (c === 46) points++
    else if (c === 44 && decimalComma) {
      points++
      comma = i
    } else return undefined
  }
  if (digits === 0 || points > 1) return undefined
  const q = Number(comma < 0 ? t : `${t.slice(0, comma)}.${t.slice(comma + 1)}`)
  return q <= MAX_PLAUSIBLE_FLOW ? q : undefined
}

function findColumn(header: string[], wanted: string | undefined): number {
  if (wanted === undefined) return -1
  const w = wanted.trim().toLowerCase()
  return header.findIndex((h) => h.trim().toLowerCase() === w)
}

/** Reads a whole daily flow record; every bad line is reported, nothing is partly accepted. */
export function parseFlowCsv(rawText: string, options: FlowCsvOptions = {}): FlowCsvResult {
  let text = rawText.includes('\r') ? rawText.replace(/\r\n?/g, '\n') : rawText
  // papaparse drops a BOM before parsing; dropped here too, its row ends and this text stay in step.
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1)
  const tooLong = lineAfter(text, MAX_LINES)
  if (tooLong !== null) {
    const reason = `the file has more than ${MAX_LINES.toLocaleString('en-GB')} lines; at most ${MAX_LINES.toLocaleString('en-GB')} are read`
    return { ok: false, kind: 'lines', errors: [{ line: tooLong, reason }], errorCount: 1, message: `file: ${reason}` }
  }
  const first = firstContentLine(text)
  const delimiter = pickDelimiter(first.text)
  if (first.text.split(delimiter).length > MAX_FIELDS) {
    const reason = `the header has more than ${MAX_FIELDS} columns`
    return { ok: false, kind: 'lines', errors: [{ line: first.line, reason }], errorCount: 1, message: `file: line ${first.line}: ${reason}` }
  }
  const rows = readRows(text, delimiter)
  const headerRow = rows[0]
  if (!headerRow) return { ok: false, kind: 'lines', errors: [{ line: 1, reason: 'the file has no lines' }], errorCount: 1, message: 'file: has no lines' }
  const header = headerRow.cells.map((c) => c.trim())
  const longName = header.findIndex((h) => h.length > MAX_HEADER_CELL)
  if (longName >= 0) {
    const reason = `column ${longName + 1}'s name "${quoted(header[longName]!)}" is longer than ${MAX_HEADER_CELL} characters`
    return { ok: false, kind: 'lines', errors: [{ line: headerRow.line, reason }], errorCount: 1, message: `file: line ${headerRow.line}: ${reason}` }
  }

  if (header.some((h) => dateFormatOf(h) !== null)) {
    return {
      ok: false,
      kind: 'lines',
      errors: [{ line: headerRow.line, reason: 'the first line holds data; it must be a header naming the columns, e.g. date,flow' }],
      errorCount: 1,
      message: `file: line ${headerRow.line} must be a header row naming the columns`,
    }
  }

  // Columns: given by the caller, else by name.
  const columnsError = (message: string) => ({ ok: false as const, kind: 'columns' as const, header, message })
  let dateIdx = findColumn(header, options.dateColumn)
  let flowIdx = findColumn(header, options.flowColumn)
  if (options.dateColumn !== undefined && dateIdx < 0) return columnsError(`dateColumn: the header has no column "${options.dateColumn}"`)
  if (options.flowColumn !== undefined && flowIdx < 0) return columnsError(`flowColumn: the header has no column "${options.flowColumn}"`)
  if (dateIdx < 0) {
    const found = header.map((h, i) => (i !== flowIdx && matches(h, DATE_WORDS) ? i : -1)).filter((i) => i >= 0)
    if (found.length !== 1) return columnsError(found.length ? 'dateColumn: several columns could hold the date; choose one' : 'dateColumn: no column is named like a date; choose one')
    dateIdx = found[0]!
  }
  if (flowIdx < 0) {
    const found = header.map((h, i) => (i !== dateIdx && matches(h, FLOW_WORDS) ? i : -1)).filter((i) => i >= 0)
    if (found.length === 0 && header.length === 2) found.push(1 - dateIdx)
    if (found.length !== 1) return columnsError(found.length ? 'flowColumn: several columns could hold the flow; choose one' : 'flowColumn: no column is named like a flow; choose one')
    flowIdx = found[0]!
  }
  if (dateIdx === flowIdx) return columnsError('flowColumn: must not be the date column')
  const flagIdx = header.findIndex((h, i) => i !== dateIdx && i !== flowIdx && matches(h, FLAG_WORDS))

  const dataRows = rows.slice(1)
  if (dataRows.length === 0) {
    return { ok: false, kind: 'lines', errors: [{ line: headerRow.line + 1, reason: 'the file has a header but no days' }], errorCount: 1, message: 'file: has a header but no days' }
  }
  const maxDays = options.maxDays ?? Infinity
  if (dataRows.length > maxDays) {
    return {
      ok: false,
      kind: 'lines',
      errors: [{ line: dataRows[maxDays]!.line, reason: `the file has ${dataRows.length} days; at most ${maxDays} are accepted` }],
      errorCount: 1,
      message: `file: has more than ${maxDays} days`,
    }
  }

  let format: CsvDateFormat | null = options.dateFormat && options.dateFormat !== 'auto' ? options.dateFormat : null
  if (!format) {
    for (const r of dataRows) {
      format = dateFormatOf(r.cells[dateIdx] ?? '')
      if (format) break
    }
    format ??= 'iso'
  }

  const decimalComma = delimiter === ';'
  const needed = Math.max(dateIdx, flowIdx) + 1
  const errors: CsvLineError[] = []
  let errorCount = 0
  const refuse = (line: number, reason: string) => {
    if (errorCount++ < MAX_LISTED_ERRORS) errors.push({ line, reason })
  }
  // Each day's first line. While the days come in order (the usual file) a day later than the latest
  // so far cannot repeat one, so the map is only built, from these lists, once a day comes out of order.
  const seenDays: string[] = []
  const seenLines: number[] = []
  let seen: Map<string, number> | null = null
  let inOrder = true
  let latest = ''
  const days: ParsedDay[] = []
  let gaps = 0
  let flagged = 0
  for (const { cells, line } of dataRows) {
    if (cells.length < needed) {
      refuse(line, `the line has ${cells.length} field${cells.length === 1 ? '' : 's'}; the header has ${header.length}`)
      continue
    }
    let dateReason: string | null = null
    let date = plainDay(cells[dateIdx]!, format)
    if (date === null) {
      const parsedDate = parseDay(cells[dateIdx]!, format)
      if ('error' in parsedDate) dateReason = parsedDate.error
      else date = parsedDate.date
    }
    if (date !== null) {
      let before: number | undefined
      if (!inOrder || date <= latest) {
        if (!seen) {
          seen = new Map()
          for (let i = 0; i < seenDays.length; i++) seen.set(seenDays[i]!, seenLines[i]!)
        }
        before = seen.get(date)
      }
      if (before !== undefined) dateReason = `day ${date} is given twice (first on line ${before})`
      else if (options.existingDays?.has(date)) dateReason = `day ${date} is already stored; append adds new days only`
      else {
        if (seen) seen.set(date, line)
        else {
          seenDays.push(date)
          seenLines.push(line)
        }
        if (inOrder && date > latest) latest = date
        else inOrder = false
      }
    }
    let flowReason: string | null = null
    let flow = plainFlow(cells[flowIdx]!, decimalComma)
    let isFlagged = false
    if (flow === undefined) {
      const parsedFlow = parseFlowCell(cells[flowIdx]!, decimalComma)
      if ('error' in parsedFlow) {
        flowReason = parsedFlow.error
        flow = null
      } else {
        flow = parsedFlow.flow
        isFlagged = parsedFlow.flagged
      }
    }
    if (flagIdx >= 0 && flow !== null) {
      const flag = cells[flagIdx] ?? ''
      if (flag !== '' && !GOOD_FLAGS.has(flag.trim().toLowerCase())) {
        flow = null
        isFlagged = true
      }
    }
    if (dateReason !== null || flowReason !== null) {
      refuse(line, dateReason !== null && flowReason !== null ? `${dateReason}; ${flowReason}` : (dateReason ?? flowReason)!)
      continue
    }
    if (flow === null) gaps++
    if (isFlagged) flagged++
    days.push({ date: date!, flow })
  }
  if (errorCount) {
    const first = errors[0]!
    const more = errorCount > 1 ? ` (and ${errorCount - 1} more line${errorCount > 2 ? 's' : ''})` : ''
    return { ok: false, kind: 'lines', errors, errorCount, message: `file: line ${first.line}: ${first.reason}${more}; nothing was stored` }
  }
  // Days that came in order (checked above as they were read) need no sort.
  if (!inOrder) days.sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0))
  return {
    ok: true,
    days,
    header,
    dateColumn: header[dateIdx]!,
    flowColumn: header[flowIdx]!,
    flagColumn: flagIdx >= 0 ? header[flagIdx]! : null,
    dateFormat: format,
    delimiter,
    gaps,
    flagged,
  }
}

/** Whole days from the first to the last day inclusive (UTC calendar arithmetic). */
export function daySpan(firstDay: string, lastDay: string): number {
  return Math.round((Date.parse(`${lastDay}T00:00:00Z`) - Date.parse(`${firstDay}T00:00:00Z`)) / 86_400_000) + 1
}
