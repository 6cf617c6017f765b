import { siteDto } from '~~/server/domain/sites'
import { SiteParamsSchema } from '#shared/schemas/site'
import { READER_ROLES } from '#shared/utils/roles'

// One site, for every role of its organisation; 404 for anyone else and for a soft-deleted site.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { site } = await requireSite(event, id, READER_ROLES)
  return siteDto(useDb(), site)
})
