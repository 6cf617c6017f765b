import { listCommissioning } from '~~/server/domain/commissioning'
import type { CommissioningListDto } from '#shared/schemas/commissioning'
import { SiteParamsSchema } from '#shared/schemas/site'
import { READER_ROLES } from '#shared/utils/roles'

// A site's commissioning records, newest measurement first, with the assessments a new one may be
// checked against. Every role that reads the site reads them.
export default defineEventHandler(async (event): Promise<CommissioningListDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { site } = await requireSite(event, id, READER_ROLES)
  return listCommissioning(useDb(), site.id)
})
