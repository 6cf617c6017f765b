import { listOptions } from '~~/server/domain/options'
import { SiteParamsSchema } from '#shared/schemas/site'
import type { OptionListDto } from '#shared/schemas/option'
import { READER_ROLES } from '#shared/utils/roles'

// The live design options of a site, oldest first, each with its newest assessment; every role reads.
export default defineEventHandler(async (event): Promise<OptionListDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  await requireSite(event, id, READER_ROLES)
  return { siteId: id, options: await listOptions(useDb(), id) }
})
