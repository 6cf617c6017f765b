import { revokeSummaryLink, summaryLinkById } from '~~/server/domain/summaryLinks'
import { SummaryLinkParamsSchema, type SummaryLinkDto } from '#shared/schemas/summaryLink'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins of the link's organisation revoke it; it stops working at once and stays in
// the list as revoked. Revoking twice answers 409.
export default defineEventHandler(async (event): Promise<SummaryLinkDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SummaryLinkParamsSchema, 'params'))
  await requireUser(event)
  const link = await summaryLinkById(useDb(), id)
  if (!link) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Summary link not found' })
  const { user, site } = await requireSite(event, link.site_id, EDITOR_ROLES, { notFound: 'Summary link not found' })
  const { link: revoked, before } = await revokeSummaryLink(useDb(), { link, siteName: site.name, userId: user.id, now: nowIso() })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'summary-link.revoked',
    targetType: 'summary_link',
    targetId: link.id,
    detail: { before: { state: before }, after: { state: 'revoked' }, siteId: site.id },
  })
  return revoked
})
