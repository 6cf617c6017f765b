import { OrgParamsSchema } from '../../../../shared/schemas/common'
import { OrgOptionsQuerySchema, type OrgOptionsDto } from '../../../../shared/schemas/option'
import { READER_ROLES } from '../../../../shared/utils/roles'

// The organisation's live sites, by name and paged (200 at most a page), each with its live options
// and their newest assessments: what the comparison's picker shows, in three queries rather than one
// request per site. Every role reads.
export default defineEventHandler(async (event): Promise<OrgOptionsDto> => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, READER_ROLES)
  const { page, pageSize } = await getValidatedQuery(event, validator(OrgOptionsQuerySchema, 'query'))
  const db = useDb()
  const live = db.selectFrom('sites').where('sites.org_id', '=', orgId).where('sites.deleted_at', 'is', null)
  const [sites, total] = await Promise.all([
    live.select(['sites.id', 'sites.name', 'sites.river_name']).orderBy('sites.name').orderBy('sites.id').limit(pageSize).offset((page - 1) * pageSize).execute(),
    live.select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow(),
  ])
  const rows = sites.length === 0
    ? []
    : await db
        .selectFrom('options')
        .leftJoin('users', 'users.id', 'options.created_by')
        .selectAll('options')
        .select('users.name as creator_name')
        .where('options.site_id', 'in', sites.map((s) => s.id))
        .where('options.deleted_at', 'is', null)
        .orderBy('options.id')
        .execute()
  const latest = await latestAssessments(rows.map((r) => r.id))
  return {
    page,
    pageSize,
    total: Number(total.n),
    sites: sites.map((s) => ({
      siteId: s.id,
      siteName: s.name,
      riverName: s.river_name,
      options: rows
        .filter((r) => r.site_id === s.id)
        .map(({ creator_name, ...row }) => optionDto(row, creator_name, latest.get(row.id) ?? null)),
    })),
  }
})
