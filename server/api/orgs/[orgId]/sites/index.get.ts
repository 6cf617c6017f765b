import { listSites } from '~~/server/domain/sites'
import { OrgParamsSchema } from '#shared/schemas/common'
import { SiteListQuerySchema, type SiteListDto } from '#shared/schemas/siteList'
import { READER_ROLES } from '#shared/utils/roles'

// One page of an organisation's sites, sorted by an allow-listed column, filtered by text and river;
// `deleted=only` lists the soft-deleted ones instead (admins only, so they can restore them).
export default defineEventHandler(async (event): Promise<SiteListDto> => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  const { role } = await requireRole(event, orgId, READER_ROLES)
  const query = await getValidatedQuery(event, validator(SiteListQuerySchema, 'query'))
  if (query.deleted === 'only' && role !== 'admin') {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `deleted: listing deleted sites needs the admin role; you are ${role}` })
  }
  return listSites(useDb(), orgId, query)
})
