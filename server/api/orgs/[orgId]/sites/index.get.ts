import { sql, type ExpressionBuilder } from 'kysely'
import type { Database } from '../../../../../db/schema'
import { OrgParamsSchema } from '../../../../../shared/schemas/common'
import { SiteListQuerySchema, type SiteListDto, type SiteSort } from '../../../../../shared/schemas/site'
import { READER_ROLES } from '../../../../../shared/utils/roles'

const SORT_COLUMNS = {
  name: 'sites.name',
  riverName: 'sites.river_name',
  grossHeadM: 'sites.gross_head_m',
  createdAt: 'sites.created_at',
  updatedAt: 'sites.updated_at',
} as const satisfies Record<SiteSort, string>

// One page of an organisation's sites, sorted by an allow-listed column, filtered by text and river;
// `deleted=only` lists the soft-deleted ones instead (admins only, so they can restore them).
export default defineEventHandler(async (event): Promise<SiteListDto> => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  const { role } = await requireRole(event, orgId, READER_ROLES)
  const query = await getValidatedQuery(event, validator(SiteListQuerySchema, 'query'))
  if (query.deleted === 'only' && role !== 'admin') {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `deleted: listing deleted sites needs the admin role; you are ${role}` })
  }
  const where = (eb: ExpressionBuilder<Database, 'sites'>) => {
    const conditions = [eb('sites.org_id', '=', orgId), eb('sites.deleted_at', query.deleted === 'only' ? 'is not' : 'is', null)]
    if (query.q) {
      const pattern = likeAnywhere(query.q)
      conditions.push(eb.or([sql<boolean>`${sql.ref('sites.name')} like ${pattern} escape '\\'`, sql<boolean>`${sql.ref('sites.river_name')} like ${pattern} escape '\\'`]))
    }
    if (query.river) conditions.push(eb('sites.river_name', '=', query.river))
    return eb.and(conditions)
  }
  const db = useDb()
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
      altitudeM: r.altitude_m,
      grossHeadM: r.gross_head_m,
      hydrologySource: hydrologySourceOf(r.record_site_id !== null, Number(r.fdc_point_count)),
      recordMeanFlow: r.mean_flow ?? null,
      version: r.version,
      createdAt: r.created_at,
      updatedAt: r.updated_at,
      deletedAt: r.deleted_at,
    })),
  }
})
