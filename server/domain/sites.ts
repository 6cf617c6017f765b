// Sites: creating, changing, deleting and restoring them, listing them (page, map) with the one text
// filter the lists and the portfolio share, and a stored site as the API shows it. Plain functions
// over a Kysely handle (a transaction works too); routes, the seed and the benchmarks call them.
import { sql, type ExpressionBuilder, type Kysely } from 'kysely'
import type { Database, SiteRow } from '../../db/schema'
import type { Catchment, FdcPointInput, HeadRow, HydrologySource, Month, Reach, ReservedFlow, SiteDto, SiteInput, SitePatch, Weir } from '../../shared/schemas/site'
import type { FlowRulesSetting } from '../../shared/schemas/flowRules'
import type { SiteListDto, SiteListQuery, SiteMapPoint, SiteSort } from '../../shared/schemas/siteList'
import { conflict } from './errors'
import { loadFlowRecord } from './flowRecords'
import { organisationCurrency } from './organisations'

/** A LIKE pattern finding `text` anywhere, with % _ and \ taken literally (use with `escape '\'`). */
export const likeAnywhere = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`

/**
 * The site text filter of every list (sites page, map, portfolio): `text` anywhere in the site's
 * name or its river's name, case-insensitively (both columns collate nocase), wildcards literal.
 */
export function siteTextFilter<DB, TB extends keyof DB>(eb: ExpressionBuilder<DB, TB>, text: string) {
  const pattern = likeAnywhere(text)
  return eb.or([sql<boolean>`${sql.ref('sites.name')} like ${pattern} escape '\\'`, sql<boolean>`${sql.ref('sites.river_name')} like ${pattern} escape '\\'`])
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
  if (input.altitude_m !== undefined) cols.altitude_m = input.altitude_m
  if (input.weir !== undefined) {
    cols.weir = JSON.stringify(input.weir)
    cols.gross_head_m = input.weir.grossHead_m
  }
  if (input.headTable !== undefined) cols.head_table = JSON.stringify(input.headTable)
  if (input.reservedFlow !== undefined) cols.reserved_flow = JSON.stringify(input.reservedFlow)
  if (input.flowRules !== undefined) cols.flow_rules = JSON.stringify(input.flowRules)
  if (input.months !== undefined) cols.months = JSON.stringify(input.months)
  if (input.catchment !== undefined) cols.catchment = input.catchment === null ? null : JSON.stringify(input.catchment)
  if (input.fdcPoints !== undefined) cols.fdc_points = JSON.stringify(input.fdcPoints)
  if (input.targetOxygen_mgL !== undefined) cols.target_oxygen_mgl = input.targetOxygen_mgL
  if (input.notes !== undefined) cols.notes = input.notes
  return cols
}

/** The site with this id, deleted or not; undefined when there is none. */
export async function siteById(db: Kysely<Database>, siteId: number): Promise<SiteRow | undefined> {
  return db.selectFrom('sites').selectAll().where('id', '=', siteId).executeTakeFirst()
}

/** Stores a new site of `orgId` made by `userId`; returns its row. */
export async function createSite(db: Kysely<Database>, args: { orgId: number; userId: number | null; input: SiteInput }): Promise<SiteRow> {
  const { input } = args
  const cols = siteColumns(input)
  return db
    .insertInto('sites')
    .values({
      org_id: args.orgId,
      created_by: args.userId,
      name: input.name,
      river_name: input.riverName,
      lat: input.location.lat,
      lng: input.location.lng,
      altitude_m: input.altitude_m,
      gross_head_m: input.weir.grossHead_m,
      target_oxygen_mgl: input.targetOxygen_mgL,
      weir: cols.weir!,
      reserved_flow: cols.reserved_flow!,
      flow_rules: cols.flow_rules,
      months: cols.months!,
      reach: cols.reach ?? null,
      catchment: cols.catchment ?? null,
      head_table: cols.head_table,
      fdc_points: cols.fdc_points,
      notes: cols.notes,
    })
    .returningAll()
    .executeTakeFirstOrThrow()
}

/**
 * The 409 for an update whose `version` no longer matches the stored record (optimistic
 * concurrency): names the current version so the client can reload and apply its change again.
 */
export async function staleVersionError(db: Kysely<Database>, table: 'sites' | 'options', id: number, sent: number, noun: string) {
  const current = await db.selectFrom(table).select(['version', 'updated_at']).where('id', '=', id).executeTakeFirst()
  return conflict(
    `version: the ${noun} was changed by someone else (now version ${current?.version ?? '?'}, you sent ${sent}); reload it and apply your change again`,
    { currentVersion: current?.version ?? null, updatedAt: current?.updated_at ?? null },
  )
}

/**
 * Applies `patch` to a live site when the stored version is still `patch.version`; each field given
 * replaces the stored one. 409 (see staleVersionError) when someone else saved since. Returns the
 * new row and the names of the fields given.
 */
export async function updateSite(db: Kysely<Database>, siteId: number, { version, ...fields }: SitePatch, now: string): Promise<{ site: SiteRow; changed: string[] }> {
  const changed = Object.keys(fields).filter((k) => fields[k as keyof typeof fields] !== undefined)
  const updated = await db
    .updateTable('sites')
    .set({ ...siteColumns(fields), version: sql<number>`version + 1`, updated_at: now })
    .where('id', '=', siteId)
    .where('version', '=', version)
    .where('deleted_at', 'is', null)
    .returningAll()
    .executeTakeFirst()
  if (!updated) throw await staleVersionError(db, 'sites', siteId, version, 'site')
  return { site: updated, changed }
}

/** Deletes a site softly (it can be restored); a site already deleted is left as it is. */
export async function deleteSite(db: Kysely<Database>, siteId: number, userId: number, now: string): Promise<void> {
  await db.updateTable('sites').set({ deleted_at: now, deleted_by: userId }).where('id', '=', siteId).where('deleted_at', 'is', null).execute()
}

/** Brings back a soft-deleted site (its version moves on); returns its row. */
export async function restoreSite(db: Kysely<Database>, siteId: number, now: string): Promise<SiteRow> {
  return db
    .updateTable('sites')
    .set({ deleted_at: null, deleted_by: null, version: sql<number>`version + 1`, updated_at: now })
    .where('id', '=', siteId)
    .returningAll()
    .executeTakeFirstOrThrow()
}

/** Which hydrology the engine will use for a site. */
export function hydrologySourceOf(hasRecord: boolean, fdcPointCount: number): HydrologySource {
  if (hasRecord) return 'record'
  return fdcPointCount >= 3 ? 'points' : 'none'
}

/** A site row as GET /api/sites/[id] shows it. */
export async function siteDto(db: Kysely<Database>, site: SiteRow): Promise<SiteDto> {
  const [creator, flowRecord, currency] = await Promise.all([
    site.created_by === null ? undefined : db.selectFrom('users').select(['id', 'name']).where('id', '=', site.created_by).executeTakeFirst(),
    loadFlowRecord(db, site.id),
    organisationCurrency(db, site.org_id),
  ])
  const fdcPoints = JSON.parse(site.fdc_points) as FdcPointInput[]
  return {
    id: site.id,
    orgId: site.org_id,
    name: site.name,
    riverName: site.river_name,
    location: { lat: site.lat, lng: site.lng },
    reach: site.reach === null ? null : (JSON.parse(site.reach) as Reach),
    altitude_m: site.altitude_m,
    weir: JSON.parse(site.weir) as Weir,
    headTable: JSON.parse(site.head_table) as HeadRow[],
    reservedFlow: JSON.parse(site.reserved_flow) as ReservedFlow,
    flowRules: JSON.parse(site.flow_rules) as FlowRulesSetting,
    months: JSON.parse(site.months) as Month[],
    catchment: site.catchment === null ? null : (JSON.parse(site.catchment) as Catchment),
    fdcPoints,
    targetOxygen_mgL: site.target_oxygen_mgl,
    notes: site.notes,
    version: site.version,
    createdAt: site.created_at,
    updatedAt: site.updated_at,
    createdBy: creator ?? null,
    deletedAt: site.deleted_at,
    hydrologySource: hydrologySourceOf(flowRecord !== null, fdcPoints.length),
    flowRecord,
    currency,
  }
}

const SORT_COLUMNS = {
  name: 'sites.name',
  riverName: 'sites.river_name',
  grossHead_m: 'sites.gross_head_m',
  createdAt: 'sites.created_at',
  updatedAt: 'sites.updated_at',
} as const satisfies Record<SiteSort, string>

/** The list filters: the organisation, live or (`deleted=only`) deleted sites, text and river. */
function siteListWhere(orgId: number, query: Pick<SiteListQuery, 'q' | 'river' | 'deleted'>) {
  return (eb: ExpressionBuilder<Database, 'sites'>) => {
    const conditions = [eb('sites.org_id', '=', orgId), eb('sites.deleted_at', query.deleted === 'only' ? 'is not' : 'is', null)]
    if (query.q) conditions.push(siteTextFilter(eb, query.q))
    if (query.river) conditions.push(eb('sites.river_name', '=', query.river))
    return eb.and(conditions)
  }
}

/** One page of an organisation's sites, sorted by an allow-listed column, with the total. */
export async function listSites(db: Kysely<Database>, orgId: number, query: SiteListQuery): Promise<SiteListDto> {
  const where = siteListWhere(orgId, query)
  const [rows, total] = await Promise.all([
    db
      .selectFrom('sites')
      .leftJoin('flow_records', 'flow_records.site_id', 'sites.id')
      .select([
        'sites.id',
        'sites.name',
        'sites.river_name',
        'sites.lat',
        'sites.lng',
        'sites.altitude_m',
        'sites.gross_head_m',
        'sites.version',
        'sites.created_at',
        'sites.updated_at',
        'sites.deleted_at',
        'flow_records.site_id as record_site_id',
        'flow_records.mean_flow',
        sql<number>`json_array_length(sites.fdc_points)`.as('fdc_point_count'),
      ])
      .where(where)
      .orderBy(SORT_COLUMNS[query.sort], query.dir)
      .orderBy('sites.id', query.dir)
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize)
      .execute(),
    db.selectFrom('sites').select((eb) => eb.fn.countAll<number>().as('n')).where(where).executeTakeFirstOrThrow(),
  ])
  return {
    page: query.page,
    pageSize: query.pageSize,
    total: Number(total.n),
    sort: query.sort,
    dir: query.dir,
    sites: rows.map((r) => ({
      id: r.id,
      name: r.name,
      riverName: r.river_name,
      location: { lat: r.lat, lng: r.lng },
      altitude_m: r.altitude_m,
      grossHead_m: r.gross_head_m,
      hydrologySource: hydrologySourceOf(r.record_site_id !== null, Number(r.fdc_point_count)),
      recordMeanFlow: r.mean_flow ?? null,
      version: r.version,
      createdAt: r.created_at,
      updatedAt: r.updated_at,
      deletedAt: r.deleted_at,
    })),
  }
}

/** Every live site of the organisation as a map marker (no paging), with the list's filters. */
export async function siteMapPoints(db: Kysely<Database>, orgId: number, query: Pick<SiteListQuery, 'q' | 'river'>): Promise<SiteMapPoint[]> {
  const rows = await db
    .selectFrom('sites')
    .leftJoin('flow_records', 'flow_records.site_id', 'sites.id')
    .select([
      'sites.id',
      'sites.name',
      'sites.river_name',
      'sites.lat',
      'sites.lng',
      'sites.gross_head_m',
      'flow_records.site_id as record_site_id',
      sql<number>`json_array_length(sites.fdc_points)`.as('fdc_point_count'),
    ])
    .where(siteListWhere(orgId, { q: query.q, river: query.river }))
    .orderBy('sites.name')
    .orderBy('sites.id')
    .execute()
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    riverName: r.river_name,
    lat: r.lat,
    lng: r.lng,
    grossHead_m: r.gross_head_m,
    hydrologySource: hydrologySourceOf(r.record_site_id !== null, Number(r.fdc_point_count)),
  }))
}
