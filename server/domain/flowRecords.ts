// Flow records: a site's gauged daily flows (flow_days) and their summary row (flow_records):
// storing an upload (replace or append, checked whole first), removing it, and reading it back as
// the API shows it, scaled to the site by the record's catchment-area ratio.
// Longer than most files: replace and append share the checks, the scaling and the statistics.
import { CompiledQuery, type Kysely, type Transaction } from 'kysely'
import Papa from 'papaparse'
import type { Database, FlowRecordRow, SiteRow } from '../../db/schema'
import { fdcFromRecord, fdcStats, scaleByAreaRatio, type DailyFlow } from '../../shared/engine/hydrology'
import type { Catchment } from '../../shared/schemas/site'
import { FLOW_CSV_EXTENSIONS, FLOW_CSV_TYPES, MAX_FLOW_DAYS, type FlowRecordForm, type FlowRecordSummary, type FlowUploadErrorData, type FlowUploadResult } from '../../shared/schemas/flowRecord'
import { DomainError, notFound } from './errors'
import { daySpan, decodeCsvBytes, parseFlowCsv, type ParsedDay } from './flowCsv'
import { inTransaction } from './transaction'

/** Rows per INSERT: 3 parameters a row stays far below SQLite's 32,766-parameter limit. */
const INSERT_BATCH = 2000

/** `insert into flow_days … values (?, ?, ?), …` for `rows` rows, the full-batch text kept once built. */
const insertSql = (rows: number) => `insert into "flow_days" ("site_id", "day", "flow") values ${Array.from({ length: rows }, () => '(?, ?, ?)').join(', ')}`
let fullBatchSql: string | undefined

/** Where a record came from and how it is read; the counts and statistics are worked out here. */
export interface FlowRecordMeta {
  fileName: string
  uploadedBy: number | null
  /** When it was stored (ISO). */
  uploadedAt: string
  dateColumn: string
  flowColumn: string
  flagColumn: string | null
  dateFormat: 'iso' | 'day-first'
  scale: { siteArea_km2: number; gaugeArea_km2: number } | null
}

/** The site flows of gauged days under an area-ratio scaling (or as given). */
export function siteFlows(days: readonly ParsedDay[], scale: FlowRecordMeta['scale']): DailyFlow[] {
  if (!scale) return days as DailyFlow[]
  const scaled = scaleByAreaRatio(days.map((d) => d.flow), scale.siteArea_km2, scale.gaugeArea_km2)
  return days.map((d, i) => ({ date: d.date, flow: scaled[i] ?? null }))
}

/** The flow_records row for `allDays` (sorted, gauged flows) and the meta. */
export function recordRow(siteId: number, allDays: readonly ParsedDay[], meta: FlowRecordMeta): FlowRecordRow {
  const stats = statsOfDays(siteFlows(allDays, meta.scale))
  const first = allDays[0]!.date
  const last = allDays.at(-1)!.date
  return {
    site_id: siteId,
    file_name: meta.fileName,
    uploaded_by: meta.uploadedBy,
    uploaded_at: meta.uploadedAt,
    date_column: meta.dateColumn,
    flow_column: meta.flowColumn,
    flag_column: meta.flagColumn,
    date_format: meta.dateFormat,
    day_count: allDays.length,
    gap_count: allDays.reduce((n, d) => n + (d.flow === null ? 1 : 0), 0),
    first_day: first,
    last_day: last,
    site_area_km2: meta.scale?.siteArea_km2 ?? null,
    gauge_area_km2: meta.scale?.gaugeArea_km2 ?? null,
    scale_factor: meta.scale ? meta.scale.siteArea_km2 / meta.scale.gaugeArea_km2 : 1,
    q95: stats?.q95 ?? null,
    q50: stats?.q50 ?? null,
    q10: stats?.q10 ?? null,
    mean_flow: stats?.mean ?? null,
  }
}

/**
 * Stores a record in one transaction: `replace` swaps every stored day for `newDays`; `append` adds
 * them to `storedDays` (the caller has checked none repeats). Nothing changes if any statement fails
 * (pass a transaction to join it).
 */
export async function saveFlowRecord(
  db: Kysely<Database>,
  siteId: number,
  mode: 'replace' | 'append',
  newDays: readonly ParsedDay[],
  storedDays: readonly ParsedDay[],
  meta: FlowRecordMeta,
) {
  const all = mode === 'replace' ? [...newDays] : mergeDays(storedDays, newDays)
  const row = recordRow(siteId, all, meta)
  const write = async (trx: Kysely<Database>) => {
    if (mode === 'replace') await trx.deleteFrom('flow_days').where('site_id', '=', siteId).execute()
    await insertDays(trx, siteId, newDays)
    await trx.deleteFrom('flow_records').where('site_id', '=', siteId).execute()
    await trx.insertInto('flow_records').values(row).execute()
  }
  await inTransaction(db, write)
  return row
}

/**
 * Bulk insert in large multi-row statements (36,525 days in 19), written here and sent as compiled
 * queries: Kysely's builder would build and compile a node for each of the 6,000 values a statement.
 */
export async function insertDays(trx: Transaction<Database> | Kysely<Database>, siteId: number, days: readonly ParsedDay[]) {
  for (let i = 0; i < days.length; i += INSERT_BATCH) {
    const rows = Math.min(INSERT_BATCH, days.length - i)
    const parameters: (number | string | null)[] = new Array(rows * 3)
    for (let k = 0; k < rows; k++) {
      const day = days[i + k]!
      parameters[3 * k] = siteId
      parameters[3 * k + 1] = day.date
      parameters[3 * k + 2] = day.flow
    }
    const text = rows === INSERT_BATCH ? (fullBatchSql ??= insertSql(INSERT_BATCH)) : insertSql(rows)
    await trx.executeQuery(CompiledQuery.raw(text, parameters))
  }
}

/** Two date-sorted lists of distinct days merged into one. */
export function mergeDays(a: readonly ParsedDay[], b: readonly ParsedDay[]): ParsedDay[] {
  const out: ParsedDay[] = []
  let i = 0
  let j = 0
  while (i < a.length || j < b.length) {
    if (j >= b.length || (i < a.length && a[i]!.date < b[j]!.date)) out.push(a[i++]!)
    else out.push(b[j++]!)
  }
  return out
}

/** The area-ratio scaling a record's flows get, or null. */
export function recordScale(rec: Pick<FlowRecordRow, 'site_area_km2' | 'gauge_area_km2' | 'scale_factor'>) {
  return rec.site_area_km2 !== null && rec.gauge_area_km2 !== null
    ? { siteArea_km2: rec.site_area_km2, gaugeArea_km2: rec.gauge_area_km2, factor: rec.scale_factor }
    : null
}

/** Q95/Q50/Q10/mean of site days, or null when none has a flow. */
export function statsOfDays(days: readonly DailyFlow[]) {
  return days.some((d) => d.flow !== null) ? fdcStats(fdcFromRecord(days)) : null
}

/** A stored record row as the API shows it. */
export function flowRecordSummary(rec: FlowRecordRow, uploader: { id: number; name: string } | null): FlowRecordSummary {
  const span = daySpan(rec.first_day, rec.last_day)
  return {
    fileName: rec.file_name,
    uploadedAt: rec.uploaded_at,
    uploadedBy: uploader,
    dateColumn: rec.date_column,
    flowColumn: rec.flow_column,
    flagColumn: rec.flag_column,
    dateFormat: rec.date_format,
    days: rec.day_count,
    gapDays: rec.gap_count,
    missingDays: span - rec.day_count,
    firstDay: rec.first_day,
    lastDay: rec.last_day,
    years: Math.round((span / 365.25) * 100) / 100,
    scale: recordScale(rec),
    stats: rec.q95 === null || rec.q50 === null || rec.q10 === null || rec.mean_flow === null ? null : { q95: rec.q95, q50: rec.q50, q10: rec.q10, mean: rec.mean_flow },
  }
}

/** The stored record of a site with its uploader, or null. */
export async function loadFlowRecord(db: Kysely<Database>, siteId: number): Promise<FlowRecordSummary | null> {
  const rec = await db
    .selectFrom('flow_records')
    .leftJoin('users', 'users.id', 'flow_records.uploaded_by')
    .selectAll('flow_records')
    .select(['users.name as uploader_name'])
    .where('flow_records.site_id', '=', siteId)
    .executeTakeFirst()
  if (!rec) return null
  const { uploader_name, ...row } = rec
  return flowRecordSummary(row, row.uploaded_by !== null && uploader_name ? { id: row.uploaded_by, name: uploader_name } : null)
}

/** The stored record of a site, or a 404 saying the site has none. */
export async function requireFlowRecord(db: Kysely<Database>, siteId: number): Promise<FlowRecordSummary> {
  const record = await loadFlowRecord(db, siteId)
  if (!record) throw notFound('This site has no flow record')
  return record
}

/** Every stored day of a site (optionally a range), flows scaled to the site by the record's area ratio. */
export async function loadSiteDays(
  db: Kysely<Database>,
  siteId: number,
  scale: { siteArea_km2: number; gaugeArea_km2: number } | null,
  range: { from?: string; to?: string } = {},
): Promise<DailyFlow[]> {
  let q = db.selectFrom('flow_days').select(['day', 'flow']).where('site_id', '=', siteId)
  if (range.from) q = q.where('day', '>=', range.from)
  if (range.to) q = q.where('day', '<=', range.to)
  const rows = await q.orderBy('day').execute()
  const flows = rows.map((r) => r.flow)
  const scaled = scale ? scaleByAreaRatio(flows, scale.siteArea_km2, scale.gaugeArea_km2) : flows
  return rows.map((r, i) => ({ date: r.day, flow: scaled[i] ?? null }))
}

/** Removes a site's record and all its days in one transaction; 404 when there is none. Returns what was removed. */
export async function deleteFlowRecord(db: Kysely<Database>, siteId: number): Promise<{ fileName: string; days: number }> {
  const removed = await db.transaction().execute(async (trx) => {
    const rec = await trx.deleteFrom('flow_records').where('site_id', '=', siteId).returning(['file_name', 'day_count']).executeTakeFirst()
    if (rec) await trx.deleteFrom('flow_days').where('site_id', '=', siteId).execute()
    return rec
  })
  if (!removed) throw notFound('This site has no flow record')
  return { fileName: removed.file_name, days: removed.day_count }
}

/** An uploaded file as the upload route read it. */
export interface FlowUploadFile {
  fileName: string
  mediaType: string
  data: Uint8Array
}

const unprocessableUpload = (message: string, data: FlowUploadErrorData) => new DomainError(422, message, { data: { ...data } })

/**
 * Checks an uploaded CSV whole and stores it as the site's record, replacing the stored one or
 * appending days to it. Refusals: 415 for a file that is not CSV text, 400 for a scaling that does
 * not fit, 422 listing every bad line (or asking for the columns); nothing is stored unless all of
 * the file is accepted. Scaling: append keeps the stored record's; otherwise the form's areas, else
 * the site's catchment.
 */
export async function uploadFlowRecord(
  db: Kysely<Database>,
  args: { site: Pick<SiteRow, 'id' | 'catchment'>; userId: number; file: FlowUploadFile; form: FlowRecordForm; now: string },
): Promise<{ result: Omit<FlowUploadResult, 'record'>; row: FlowRecordRow }> {
  const { site, file, form } = args
  const { fileName, mediaType } = file
  const extensionOk = FLOW_CSV_EXTENSIONS.some((ext) => fileName.toLowerCase().endsWith(ext))
  if (!(FLOW_CSV_TYPES as readonly string[]).includes(mediaType) && !extensionOk) {
    throw new DomainError(415, `file: must be a CSV or text file (.csv or .txt, ${FLOW_CSV_TYPES.join(', ')}); got ${mediaType || 'no type'} "${fileName}"`, { field: 'file' })
  }
  const text = decodeCsvBytes(file.data)
  if (text === null) throw new DomainError(415, `file: "${fileName}" is not a text file`, { field: 'file' })

  const stored = form.mode === 'append' ? await db.selectFrom('flow_records').selectAll().where('site_id', '=', site.id).executeTakeFirst() : undefined
  const storedDays = stored ? await db.selectFrom('flow_days').select(['day as date', 'flow']).where('site_id', '=', site.id).orderBy('day').execute() : []

  const formScale = form.siteArea_km2 !== undefined && form.gaugeArea_km2 !== undefined ? { siteArea_km2: form.siteArea_km2, gaugeArea_km2: form.gaugeArea_km2 } : null
  if (form.scale === 'none' && formScale) throw new DomainError(400, "scale: 'none' cannot be combined with catchment areas", { field: 'scale' })
  let scale: { siteArea_km2: number; gaugeArea_km2: number } | null
  if (stored) {
    scale = recordScale(stored)
    const same = formScale === null || (scale !== null && scale.siteArea_km2 === formScale.siteArea_km2 && scale.gaugeArea_km2 === formScale.gaugeArea_km2)
    if (!same || (form.scale === 'none' && scale !== null)) {
      throw new DomainError(400, "siteArea_km2: appended days take the stored record's scaling; replace the record to change it", { field: 'siteArea_km2' })
    }
  } else if (form.scale === 'none') scale = null
  else scale = formScale ?? (site.catchment ? (JSON.parse(site.catchment) as Catchment) : null)

  const parsed = parseFlowCsv(text, {
    dateColumn: form.dateColumn,
    flowColumn: form.flowColumn,
    dateFormat: form.dateFormat,
    existingDays: stored ? new Set(storedDays.map((d) => d.date)) : undefined,
    maxDays: MAX_FLOW_DAYS - storedDays.length,
  })
  if (!parsed.ok) {
    if (parsed.kind === 'columns') throw unprocessableUpload(parsed.message, { errors: [], needsColumns: true, header: parsed.header })
    throw unprocessableUpload(parsed.message, { errors: parsed.errors, errorCount: parsed.errorCount })
  }
  if (!parsed.days.some((d) => d.flow !== null) && !storedDays.some((d) => d.flow !== null)) {
    throw unprocessableUpload('file: has no day with a flow; every line is a gap', { errors: [] })
  }
  const row = await saveFlowRecord(db, site.id, stored ? 'append' : 'replace', parsed.days, storedDays, {
    fileName,
    uploadedBy: args.userId,
    uploadedAt: args.now,
    dateColumn: parsed.dateColumn,
    flowColumn: parsed.flowColumn,
    flagColumn: parsed.flagColumn,
    dateFormat: parsed.dateFormat,
    scale,
  })
  return { result: { mode: form.mode, daysInFile: parsed.days.length, gapsInFile: parsed.gaps, flaggedInFile: parsed.flagged }, row }
}

/** Days read and written per step, so a century (36,525 days) never sits in memory at once. */
const CHUNK_DAYS = 5000

/** The site's stored days as CSV lines, oldest first, a chunk at a time (keyset paging on the primary key). */
export async function* siteDaysCsv(db: Kysely<Database>, siteId: number, scale: { siteArea_km2: number; gaugeArea_km2: number } | null): AsyncGenerator<string> {
  yield 'date,flow_m3s\r\n'
  let after = ''
  for (;;) {
    const rows = await db.selectFrom('flow_days').select(['day', 'flow']).where('site_id', '=', siteId).where('day', '>', after).orderBy('day').limit(CHUNK_DAYS).execute()
    if (!rows.length) return
    const flows = rows.map((r) => r.flow)
    const site = scale ? scaleByAreaRatio(flows, scale.siteArea_km2, scale.gaugeArea_km2) : flows
    // 12 significant figures drop the float noise of the scaling (2.7500000000000004 → 2.75); a gap stays an empty cell.
    yield Papa.unparse(rows.map((r, i) => [r.day, site[i] === null || site[i] === undefined ? null : Number(site[i]!.toPrecision(12))]), { newline: '\r\n' }) + '\r\n'
    if (rows.length < CHUNK_DAYS) return
    after = rows.at(-1)!.day
  }
}
