import type { H3Event } from 'h3'
import type { ZodType } from 'zod'
import type { AttachmentRow, FlowRecordRow, SiteRow } from '../../db/schema'
import { fdcFromRecord, fdcStats, scaleByAreaRatio, type DailyFlow } from '../../shared/engine/hydrology'
import type {
  AttachmentDto,
  AttachmentType,
  Catchment,
  FdcPointInput,
  FlowRecordSummary,
  HeadRow,
  HydrologySource,
  Month,
  Reach,
  ReservedFlow,
  SiteDto,
  SiteInput,
  Weir,
} from '../../shared/schemas/site'
import type { Role } from '../../shared/utils/roles'
import { daySpan } from './flowCsv'

const notFoundError = (message: string) => createError({ statusCode: 404, statusMessage: 'Not Found', message })

/**
 * Gate for every site-scoped route: 401 signed out, 404 when the site does not exist, is
 * soft-deleted (unless `deleted: 'only'`, for the admin's restore) or belongs to an organisation the
 * user is not in, 403 when their role is not in `roles`.
 */
export async function requireSite(event: H3Event, siteId: number, roles: readonly Role[], opts: { deleted?: 'only'; notFound?: string } = {}) {
  await requireUser(event)
  const notFound = opts.notFound ?? 'Site not found'
  const site = await useDb().selectFrom('sites').selectAll().where('id', '=', siteId).executeTakeFirst()
  if (!site) throw notFoundError(notFound)
  const isDeleted = site.deleted_at !== null
  if (isDeleted && opts.deleted !== 'only') throw notFoundError(notFound)
  // A single-site grant (an invited reviewer, migration 0004) counts as the reviewer role on this site only.
  const grant = await siteGrantRole(event, site.id, site.org_id, roles)
  const { user, role } = grant ?? (await requireRole(event, site.org_id, roles, notFound))
  if (!isDeleted && opts.deleted === 'only') throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'Site is not deleted' })
  return { user, role, site }
}

/**
 * The role a single-site grant gives on this site when the user is not a member of its organisation
 * (or only a viewer): reviewer, with 403 when `roles` leaves reviewers out; null to fall back to
 * `requireRole`.
 */
async function siteGrantRole(event: H3Event, siteId: number, orgId: number, roles: readonly Role[]): Promise<{ user: Awaited<ReturnType<typeof requireUser>>; role: Role } | null> {
  const user = await requireUser(event)
  const member = await roleIn(user.id, orgId)
  if (member && member !== 'viewer') return null
  const grant = await useDb().selectFrom('site_grants').select('role').where('user_id', '=', user.id).where('site_id', '=', siteId).executeTakeFirst()
  if (!grant) return null
  if (!roles.includes(grant.role)) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `This needs the ${roles.join(' or ')} role; you are reviewer of this site` })
  }
  return { user, role: grant.role }
}

/** Parses already-read input (multipart fields) like the house validator: 400 naming the field. */
export function parseFields<T>(schema: ZodType<T>, input: unknown, what = 'body'): T {
  try {
    return validator(schema, what)(input)
  } catch (error) {
    if (error instanceof InputError) {
      throw createError({ statusCode: 400, statusMessage: 'Validation Error', message: error.message, data: { issues: error.issues } })
    }
    throw error
  }
}

/** The columns an accepted site input writes (never a raw body spread into an insert). */
export function siteColumns(input: Partial<SiteInput>) {
  const cols: Partial<Omit<SiteRow, 'id' | 'org_id' | 'created_by' | 'created_at' | 'updated_at' | 'deleted_at' | 'deleted_by' | 'version'>> = {}
  if (input.name !== undefined) cols.name = input.name
  if (input.riverName !== undefined) cols.river_name = input.riverName
  if (input.location !== undefined) {
    cols.lat = input.location.lat
    cols.lng = input.location.lng
  }
  if (input.reach !== undefined) cols.reach = input.reach === null ? null : JSON.stringify(input.reach)
  if (input.altitudeM !== undefined) cols.altitude_m = input.altitudeM
  if (input.weir !== undefined) {
    cols.weir = JSON.stringify(input.weir)
    cols.gross_head_m = input.weir.grossHeadM
  }
  if (input.headTable !== undefined) cols.head_table = JSON.stringify(input.headTable)
  if (input.reservedFlow !== undefined) cols.reserved_flow = JSON.stringify(input.reservedFlow)
  if (input.months !== undefined) cols.months = JSON.stringify(input.months)
  if (input.catchment !== undefined) cols.catchment = input.catchment === null ? null : JSON.stringify(input.catchment)
  if (input.fdcPoints !== undefined) cols.fdc_points = JSON.stringify(input.fdcPoints)
  if (input.targetOxygenMgL !== undefined) cols.target_oxygen_mgl = input.targetOxygenMgL
  if (input.notes !== undefined) cols.notes = input.notes
  return cols
}

/** Current time as SQLite's defaults write it. */
export const nowIso = () => new Date().toISOString()

/** The area-ratio scaling a record's flows get, or null. */
export function recordScale(rec: Pick<FlowRecordRow, 'site_area_km2' | 'gauge_area_km2' | 'scale_factor'>) {
  return rec.site_area_km2 !== null && rec.gauge_area_km2 !== null
    ? { siteAreaKm2: rec.site_area_km2, gaugeAreaKm2: rec.gauge_area_km2, factor: rec.scale_factor }
    : null
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
export async function loadFlowRecord(siteId: number): Promise<FlowRecordSummary | null> {
  const rec = await useDb()
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

/** Every stored day of a site (optionally a range), flows scaled to the site by the record's area ratio. */
export async function loadSiteDays(
  siteId: number,
  scale: { siteAreaKm2: number; gaugeAreaKm2: number } | null,
  range: { from?: string; to?: string } = {},
): Promise<DailyFlow[]> {
  let q = useDb().selectFrom('flow_days').select(['day', 'flow']).where('site_id', '=', siteId)
  if (range.from) q = q.where('day', '>=', range.from)
  if (range.to) q = q.where('day', '<=', range.to)
  const rows = await q.orderBy('day').execute()
  const flows = rows.map((r) => r.flow)
  const scaled = scale ? scaleByAreaRatio(flows, scale.siteAreaKm2, scale.gaugeAreaKm2) : flows
  return rows.map((r, i) => ({ date: r.day, flow: scaled[i] ?? null }))
}

/** Q95/Q50/Q10/mean of site days, or null when none has a flow. */
export function statsOfDays(days: readonly DailyFlow[]) {
  return days.some((d) => d.flow !== null) ? fdcStats(fdcFromRecord(days)) : null
}

/** Which hydrology the engine will use for a site. */
export function hydrologySourceOf(hasRecord: boolean, fdcPointCount: number): HydrologySource {
  if (hasRecord) return 'record'
  return fdcPointCount >= 3 ? 'points' : 'none'
}

/** A site row as GET /api/sites/[id] shows it. */
export async function siteDto(site: SiteRow): Promise<SiteDto> {
  const db = useDb()
  const [creator, flowRecord] = await Promise.all([
    site.created_by === null ? undefined : db.selectFrom('users').select(['id', 'name']).where('id', '=', site.created_by).executeTakeFirst(),
    loadFlowRecord(site.id),
  ])
  const fdcPoints = JSON.parse(site.fdc_points) as FdcPointInput[]
  return {
    id: site.id,
    orgId: site.org_id,
    name: site.name,
    riverName: site.river_name,
    location: { lat: site.lat, lng: site.lng },
    reach: site.reach === null ? null : (JSON.parse(site.reach) as Reach),
    altitudeM: site.altitude_m,
    weir: JSON.parse(site.weir) as Weir,
    headTable: JSON.parse(site.head_table) as HeadRow[],
    reservedFlow: JSON.parse(site.reserved_flow) as ReservedFlow,
    months: JSON.parse(site.months) as Month[],
    catchment: site.catchment === null ? null : (JSON.parse(site.catchment) as Catchment),
    fdcPoints,
    targetOxygenMgL: site.target_oxygen_mgl,
    notes: site.notes,
    version: site.version,
    createdAt: site.created_at,
    updatedAt: site.updated_at,
    createdBy: creator ?? null,
    deletedAt: site.deleted_at,
    hydrologySource: hydrologySourceOf(flowRecord !== null, fdcPoints.length),
    flowRecord,
  }
}

/** A LIKE pattern finding `text` anywhere, with % _ and \ taken literally (use with `escape '\'`). */
export const likeAnywhere = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`

/** Loads a live attachment of a live site and checks the role as `requireSite` does; 404 otherwise. */
export async function requireAttachment(event: H3Event, attachmentId: number, roles: readonly Role[]) {
  await requireUser(event)
  const attachment = await useDb().selectFrom('attachments').selectAll().where('id', '=', attachmentId).where('deleted_at', 'is', null).executeTakeFirst()
  if (!attachment) throw notFoundError('Attachment not found')
  const { user, role, site } = await requireSite(event, attachment.site_id, roles, { notFound: 'Attachment not found' })
  return { user, role, site, attachment }
}

/** An attachment row as the API shows it. */
export function attachmentDto(row: AttachmentRow, uploaderName: string | null): AttachmentDto {
  return {
    id: row.id,
    siteId: row.site_id,
    originalName: row.original_name,
    contentType: row.content_type as AttachmentType,
    sizeBytes: row.size_bytes,
    uploadedBy: row.uploaded_by !== null && uploaderName ? { id: row.uploaded_by, name: uploaderName } : null,
    createdAt: row.created_at,
  }
}
