import { OrgParamsSchema } from '../../../../shared/schemas/common'
import { SummaryLinkListQuerySchema, type SummaryLinkListDto } from '../../../../shared/schemas/summaryLink'

// Every summary link of the organisation's sites (live or deleted), newest first; admins only.
export default defineEventHandler(async (event): Promise<SummaryLinkListDto> => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  await requireRole(event, orgId, ['admin'])
  const { state, page, pageSize } = await getValidatedQuery(event, validator(SummaryLinkListQuerySchema, 'query'))
  let q = summaryLinkQuery().where('summary_links.org_id', '=', orgId)
  if (state) q = q.where(summaryLinkStateCondition(state))
  const [rows, total] = await Promise.all([
    q.orderBy('summary_links.id', 'desc').limit(pageSize).offset((page - 1) * pageSize).execute(),
    q.clearSelect().select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow(),
  ])
  return { page, pageSize, total: Number(total.n), links: rows.map(summaryLinkDto) }
})
