import { SummaryLinkInputSchema, SummaryLinkParamsSchema, summaryPath, type SummaryLinkCreatedDto } from '../../../../../shared/schemas/summaryLink'
import { EDITOR_ROLES } from '../../../../../shared/utils/roles'

const DAY_MS = 24 * 60 * 60 * 1000

// Engineers and admins make a summary link for a landowner. The token is in this answer only:
// the database keeps its SHA-256 hash.
export default defineEventHandler(async (event): Promise<SummaryLinkCreatedDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SummaryLinkParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  const { expiresInDays, note } = await readValidatedJson(event, SummaryLinkInputSchema, BODY_LIMITS.form)
  const token = newLinkToken()
  const row = await useDb()
    .insertInto('summary_links')
    .values({ site_id: site.id, org_id: site.org_id, token_hash: hashLinkToken(token), note: note || null, created_by: user.id, expires_at: isoIn(expiresInDays * DAY_MS) })
    .returningAll()
    .executeTakeFirstOrThrow()
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'summary-link.created',
    targetType: 'summary_link',
    targetId: row.id,
    detail: { before: null, after: { siteId: site.id, expiresAt: row.expires_at, note: row.note } },
  })
  setResponseStatus(event, 201)
  const path = summaryPath(token)
  return { ...summaryLinkDto({ ...row, site_name: site.name, creator_name: user.name }), token, path, url: appLink(path) }
})
