import { siteMapPoints } from '~~/server/domain/sites'
import { OrgParamsSchema } from '#shared/schemas/common'
import { SiteMapQuerySchema, type SiteMapPoint } from '#shared/schemas/siteList'
import { READER_ROLES } from '#shared/utils/roles'

// Every live site of the organisation as a map marker (no paging; a few fields each), same filters as the list.
export default defineEventHandler(async (event): Promise<{ sites: SiteMapPoint[] }> => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, READER_ROLES)
  const query = await getValidatedQuery(event, validator(SiteMapQuerySchema, 'query'))
  return { sites: await siteMapPoints(useDb(), orgId, query) }
})
