import { SiteParamsSchema } from '../../../../../shared/schemas/site'
import type { OptionListDto } from '../../../../../shared/schemas/option'
import { READER_ROLES } from '../../../../../shared/utils/roles'

// The live design options of a site, oldest first, each with its newest assessment; every role reads.
export default defineEventHandler(async (event): Promise<OptionListDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  await requireSite(event, id, READER_ROLES)
  const rows = await useDb()
    .selectFrom('options')
    .leftJoin('users', 'users.id', 'options.created_by')
    .selectAll('options')
    .select('users.name as creator_name')
    .where('options.site_id', '=', id)
    .where('options.deleted_at', 'is', null)
    .orderBy('options.id')
    .execute()
  const latest = await latestAssessments(rows.map((r) => r.id))
  return {
    siteId: id,
    options: rows.map(({ creator_name, ...row }) => optionDto(row, creator_name, latest.get(row.id) ?? null)),
  }
})
