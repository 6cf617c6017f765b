import { listSummaryLinks } from '~~/server/domain/summaryLinks'
import { SummaryLinkListQuerySchema, SummaryLinkParamsSchema, type SummaryLinkListDto } from '#shared/schemas/summaryLink'
import { EDITOR_ROLES } from '#shared/utils/roles'

// A site's summary links, newest first (never their tokens): note, dates, state and views.
export default defineEventHandler(async (event): Promise<SummaryLinkListDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SummaryLinkParamsSchema, 'params'))
  const { site } = await requireSite(event, id, EDITOR_ROLES)
  const query = await getValidatedQuery(event, validator(SummaryLinkListQuerySchema, 'query'))
  return { page: query.page, pageSize: query.pageSize, ...(await listSummaryLinks(useDb(), { siteId: site.id }, query)) }
})
