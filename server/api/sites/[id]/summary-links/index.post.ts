import { createSummaryLink } from '~~/server/domain/summaryLinks'
import { SummaryLinkInputSchema, SummaryLinkParamsSchema, summaryPath, type SummaryLinkCreatedDto } from '#shared/schemas/summaryLink'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins make a summary link for a landowner. The token is in this answer only:
// the database keeps its SHA-256 hash.
export default defineEventHandler(async (event): Promise<SummaryLinkCreatedDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SummaryLinkParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  const { expiresIn_d, note } = await readValidatedJson(event, SummaryLinkInputSchema, BODY_LIMITS.form)
  const { link, token } = await createSummaryLink(useDb(), { site, user, expiresIn_d, note: note || null })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'summary-link.created',
    targetType: 'summary_link',
    targetId: link.id,
    detail: { before: null, after: { siteId: site.id, expiresAt: link.expiresAt, note: link.note } },
  })
  setResponseStatus(event, 201)
  const path = summaryPath(token)
  return { ...link, token, path, url: appLink(path) }
})
