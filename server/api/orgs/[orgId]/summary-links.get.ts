import { listSummaryLinks } from '~~/server/domain/summaryLinks'
import { OrgParamsSchema } from '#shared/schemas/common'
import { SummaryLinkListQuerySchema, type SummaryLinkListDto } from '#shared/schemas/summaryLink'

// Every summary link of the organisation's sites (live or deleted), newest first; admins only.
export default defineEventHandler(async (event): Promise<SummaryLinkListDto> => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, ['admin'])
  const query = await getValidatedQuery(event, validator(SummaryLinkListQuerySchema, 'query'))
  return { page: query.page, pageSize: query.pageSize, ...(await listSummaryLinks(useDb(), { orgId }, query)) }
})
