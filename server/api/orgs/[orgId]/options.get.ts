import { listOrgOptions } from '~~/server/domain/options'
import { OrgParamsSchema } from '#shared/schemas/common'
import { OrgOptionsQuerySchema, type OrgOptionsDto } from '#shared/schemas/compare'
import { READER_ROLES } from '#shared/utils/roles'

// The organisation's live sites, by name and paged (200 at most a page), each with its live options
// and their newest assessments: what the comparison's picker shows, in one request rather than one
// per site. Every role reads.
export default defineEventHandler(async (event): Promise<OrgOptionsDto> => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, READER_ROLES)
  const { page, pageSize } = await getValidatedQuery(event, validator(OrgOptionsQuerySchema, 'query'))
  return listOrgOptions(useDb(), orgId, page, pageSize)
})
