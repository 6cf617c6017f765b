import { CompiledQuery, type Kysely, type Transaction } from 'kysely'
import type { Database, FlowRecordRow } from '../../db/schema'
import type { DailyFlow } from '../../shared/engine/hydrology'
import { scaleByAreaRatio } from '../../shared/engine/hydrology'
import type { ParsedDay } from './flowCsv'

/** Rows per INSERT: 3 parameters a row stays far below SQLite's 32,766-parameter limit. */
const INSERT_BATCH = 2000

/** `insert into flow_days … values (?, ?, ?), …` for `rows` rows, the full-batch text kept once built. */
const insertSql = (rows: number) => `insert into "flow_days" ("site_id", "day", "flow") values ${Array.from({ length: rows }, () => '(?, ?, ?)').join(', ')}`
let fullBatchSql: string | undefined

/** Where a record came from and how it is read; the counts and statistics are worked out here. */
export interface FlowRecordMeta {
  fileName: string
  uploadedBy: number
  dateColumn: string
  flowColumn: string
  flagColumn: string | null
  dateFormat: 'iso' | 'day-first'
  scale: { siteAreaKm2: number; gaugeAreaKm2: number } | null
}

/** The site flows of gauged days under an area-ratio scaling (or as given). */
export function siteFlows(days: readonly ParsedDay[], scale: FlowRecordMeta['scale']): DailyFlow[] {
  if (!scale) return days as DailyFlow[]
  const scaled = scaleByAreaRatio(days.map((d) => d.flow), scale.siteAreaKm2, scale.gaugeAreaKm2)
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
    uploaded_at: nowIso(),
    date_column: meta.dateColumn,
    flow_column: meta.flowColumn,
    flag_column: meta.flagColumn,
    date_format: meta.dateFormat,
    day_count: allDays.length,
    gap_count: allDays.reduce((n, d) => n + (d.flow === null ? 1 : 0), 0),
    first_day: first,
    last_day: last,
    site_area_km2: meta.scale?.siteAreaKm2 ?? null,
    gauge_area_km2: meta.scale?.gaugeAreaKm2 ?? null,
    scale_factor: meta.scale ? meta.scale.siteAreaKm2 / meta.scale.gaugeAreaKm2 : 1,
    q95: stats?.q95 ?? null,
    q50: stats?.q50 ?? null,
    q10: stats?.q10 ?? null,
    mean_flow: stats?.mean ?? null,
  }
}

/**
 * Stores a record in one transaction: `replace` swaps every stored day for `newDays`; `append` adds
 * them to `storedDays` (the caller has checked none repeats). Nothing changes if any statement fails.
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
  await db.transaction().execute(async (trx) => {
    if (mode === 'replace') await trx.deleteFrom('flow_days').where('site_id', '=', siteId).execute()
    await insertDays(trx, siteId, newDays)
    await trx.deleteFrom('flow_records').where('site_id', '=', siteId).execute()
    await trx.insertInto('flow_records').values(row).execute()
  })
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
