// A site's daily flow record: the upload's limits and form, its per-line errors, the stored record
// as the routes summarise it, and the hydrology a site shows.
import { z } from 'zod'
import { areaRatioProblem } from './assess'
import type { HydrologySource, ReservedFlow } from './site'

/** Largest flow-record CSV accepted, bytes (10 MB). */
export const MAX_FLOW_CSV_BYTES = 10 * 1024 * 1024
/** Most days one site's flow record may hold (about 219 years). */
export const MAX_FLOW_DAYS = 80_000
/** Declared types and file endings a flow-record CSV may come with (either one will do). */
export const FLOW_CSV_TYPES = ['text/csv', 'text/plain', 'application/vnd.ms-excel'] as const
export const FLOW_CSV_EXTENSIONS = ['.csv', '.txt'] as const

/** Q95, Q50, Q10 and mean, m³/s. */
export interface FlowStats {
  q95: number
  q50: number
  q10: number
  mean: number
}

/** The stored daily flow record of a site, as summarised by the routes. Flows are site flows (scaled). */
export interface FlowRecordSummary {
  fileName: string
  uploadedAt: string
  uploadedBy: { id: number; name: string } | null
  dateColumn: string
  flowColumn: string
  /** Column read for quality flags, when the file had one. */
  flagColumn: string | null
  dateFormat: 'iso' | 'day-first'
  /** Rows stored, one a day, gaps included. */
  days: number
  /** Days stored without a flow (blank, `-`, `NA`, flagged…). */
  gapDays: number
  /** Calendar days between the first and last day with no row at all. */
  missingDays: number
  firstDay: string
  lastDay: string
  /** (last − first + 1 days) / 365.25, to 2 decimals. */
  years: number
  /** Area-ratio scaling applied to the gauged flows, or null when stored as given. */
  scale: { siteArea_km2: number; gaugeArea_km2: number; factor: number } | null
  /** From the site flows' FDC; null when no day has a flow. */
  stats: FlowStats | null
}

export const FLOW_UPLOAD_MODES = ['replace', 'append'] as const
export const DATE_FORMATS = ['auto', 'iso', 'day-first'] as const
export type DateFormat = (typeof DATE_FORMATS)[number]

const optionalArea = z
  .string()
  .trim()
  .optional()
  .transform((s) => (s === undefined || s === '' ? undefined : Number(s)))
  .pipe(z.number({ error: 'must be a number' }).positive('must be more than 0').max(1_000_000, 'is too large').optional())

/**
 * Text fields of the multipart POST /api/sites/[id]/flow-record (besides `file`).
 * `scale`: 'auto' scales by siteArea_km2/gaugeArea_km2 when both are given, else by the site's
 * catchment when it has one; 'none' stores the flows as given. Append mode keeps the stored record's scaling.
 */
export const FlowRecordFormSchema = z
  .object({
    dateColumn: z.string().trim().max(200).optional().transform((s) => s || undefined),
    flowColumn: z.string().trim().max(200).optional().transform((s) => s || undefined),
    mode: z.enum(FLOW_UPLOAD_MODES, { error: "must be 'replace' or 'append'" }).default('replace'),
    dateFormat: z.enum(DATE_FORMATS, { error: "must be 'auto', 'iso' or 'day-first'" }).default('auto'),
    scale: z.enum(['auto', 'none'], { error: "must be 'auto' or 'none'" }).default('auto'),
    siteArea_km2: optionalArea,
    gaugeArea_km2: optionalArea,
  })
  .superRefine((f, ctx) => {
    if ((f.siteArea_km2 === undefined) !== (f.gaugeArea_km2 === undefined)) {
      ctx.addIssue({ code: 'custom', path: [f.siteArea_km2 === undefined ? 'siteArea_km2' : 'gaugeArea_km2'], message: 'give both catchment areas, or neither' })
    }
    const problem = f.siteArea_km2 !== undefined && f.gaugeArea_km2 !== undefined ? areaRatioProblem(f.siteArea_km2, f.gaugeArea_km2) : null
    if (problem) ctx.addIssue({ code: 'custom', path: [problem.area === 'site' ? 'siteArea_km2' : 'gaugeArea_km2'], message: problem.message })
  })
export type FlowRecordForm = z.infer<typeof FlowRecordFormSchema>

/** One bad line of an upload: `line` is the line number in the file (1 = the first line). */
export interface FlowCsvLineError {
  line: number
  reason: string
}

/** `data` of a 422 from the upload: every bad line, or the header when the columns must be chosen. */
export interface FlowUploadErrorData {
  /** The first 1,000 bad lines. */
  errors: FlowCsvLineError[]
  /** How many lines are bad in all (absent when the header is the problem). */
  errorCount?: number
  needsColumns?: boolean
  header?: string[]
}

/** Body of a successful POST /api/sites/[id]/flow-record. */
export interface FlowUploadResult {
  mode: 'replace' | 'append'
  /** Days read from this file. */
  daysInFile: number
  /** Of which stored as gaps (blank, `-`, `NA`, flagged…). */
  gapsInFile: number
  /** Of which gaps because a value or its flag marked it suspect. */
  flaggedInFile: number
  record: FlowRecordSummary
}

/** Query of GET /api/sites/[id]/flow-record: optional day range, inclusive. */
export const FlowRecordQuerySchema = z
  .object({
    from: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date written YYYY-MM-DD').optional(),
    to: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date written YYYY-MM-DD').optional(),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { path: ['to'], message: 'must not be before from' })

/** GET /api/sites/[id]/flow-record. */
export interface FlowRecordDto {
  record: FlowRecordSummary
  /** Site flows (after any scaling), m³/s; null for a gap. */
  days: { date: string; flow: number | null }[]
}

/** GET /api/sites/[id]/hydrology. */
export interface HydrologyDto {
  source: HydrologySource
  /** Up to 200 points of the curve in use, by rising exceedance, for charting. */
  points: { exceedance: number; flow: number }[]
  stats: FlowStats | null
  /** January first; stats null for a month with no data (or when the source is points or none). */
  monthly: { month: number; days: number; stats: FlowStats | null }[]
  reservedFlow: { setting: ReservedFlow; flow: number | null }
  /** Area-ratio scaling applied, or null. */
  scale: { siteArea_km2: number; gaugeArea_km2: number; factor: number } | null
  /** Days with flow (record) or number of entered points. */
  count: number
}
