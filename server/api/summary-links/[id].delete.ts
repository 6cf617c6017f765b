import { SummaryLinkParamsSchema, type SummaryLinkDto } from '../../../shared/schemas/summaryLink'
import { EDITOR_ROLES } from '../../../shared/utils/roles'

// Engineers and admins of the link's organisation revoke it; it stops working at once and stays in
// the list as revoked. Revoking twice answers 409.
export default defineEventHandler(async (event): Promise<SummaryLinkDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SummaryLinkParamsSchema, 'params'))
  await requireUser(event)
  const link = await useDb().selectFrom('summary_links').selectAll().where('id', '=', id).executeTakeFirst()
  if (!link) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Summary link not found' })
  const { user, site } = await requireSite(event, link.site_id, EDITOR_ROLES, { notFound: 'Summary link not found' })
  const at = nowIso()
  const updated = await useDb()
    .updateTable('summary_links')
    .set({ revoked_at: at, revoked_by: user.id })
    .where('id', '=', link.id)
    .where('revoked_at', 'is', null)
    .returningAll()
    .executeTakeFirst()
  if (!updated) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `summary link: already revoked (${link.revoked_at})` })
  await audit({
    orgId: site.org_id,
    userId: user.id,
    action: 'summary-link.revoked',
    targetType: 'summary_link',
    targetId: link.id,
    detail: { before: { state: summaryLinkState(link, at) }, after: { state: 'revoked' }, siteId: site.id },
  })
  const creator = link.created_by === null ? undefined : await useDb().selectFrom('users').select('name').where('id', '=', link.created_by).executeTakeFirst()
  return summaryLinkDto({ ...updated, site_name: site.name, creator_name: creator?.name ?? null })
})
