import { sql } from 'kysely'
import { OrgParamsSchema } from '../../../../../shared/schemas/common'
import { SiteMapQuerySchema, type SiteMapPoint } from '../../../../../shared/schemas/site'
import { READER_ROLES } from '../../../../../shared/utils/roles'

// Every live site of the organisation as a map marker (no paging; a few fields each), same filters as the list.
export default defineEventHandler(async (event): Promise<{ sites: SiteMapPoint[] }> => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, READER_ROLES)
  const query = await getValidatedQuery(event, validator(SiteMapQuerySchema, 'query'))
  let q = useDb()
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
    .where('sites.org_id', '=', orgId)
    .where('sites.deleted_at', 'is', null)
  if (query.q) {
    const pattern = likeAnywhere(query.q)
    q = q.where((eb) => eb.or([sql<boolean>`${sql.ref('sites.name')} like ${pattern} escape '\\'`, sql<boolean>`${sql.ref('sites.river_name')} like ${pattern} escape '\\'`]))
  }
  if (query.river) q = q.where('sites.river_name', '=', query.river)
  const rows = await q.orderBy('sites.name').orderBy('sites.id').execute()
  return {
    sites: rows.map((r) => ({
      id: r.id,
      name: r.name,
      riverName: r.river_name,
      lat: r.lat,
      lng: r.lng,
      grossHeadM: r.gross_head_m,
      hydrologySource: hydrologySourceOf(r.record_site_id !== null, Number(r.fdc_point_count)),
    })),
  }
})
