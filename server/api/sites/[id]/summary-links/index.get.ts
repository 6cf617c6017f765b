import { SummaryLinkListQuerySchema, SummaryLinkParamsSchema, type SummaryLinkListDto } from '../../../../../shared/schemas/summaryLink'
import { EDITOR_ROLES } from '../../../../../shared/utils/roles'

// A site's summary links, newest first (never their tokens): note, dates, state and views.
export default defineEventHandler(async (event): Promise<SummaryLinkListDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SummaryLinkParamsSchema, 'params'))
  const { site } = await requireSite(event, id, EDITOR_ROLES)
  const { state, page, pageSize } = await getValidatedQuery(event, validator(SummaryLinkListQuerySchema, 'query'))
  let q = summaryLinkQuery().where('summary_links.site_id', '=', site.id)
  if (state) q = q.where(summaryLinkStateCondition(state))
  const [rows, total] = await Promise.all([
    q.orderBy('summary_links.id', 'desc').limit(pageSize).offset((page - 1) * pageSize).execute(),
    q.clearSelect().select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow(),
  ])
  return { page, pageSize, total: Number(total.n), links: rows.map(summaryLinkDto) }
})
