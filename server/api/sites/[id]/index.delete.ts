import { deleteSite } from '~~/server/domain/sites'
import { SiteParamsSchema } from '#shared/schemas/site'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins delete a site softly: it answers 404 from then on, and an admin can restore it.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  const deletedAt = nowIso()
  await deleteSite(useDb(), id, user.id, deletedAt)
  await audit({ orgId: site.org_id, userId: user.id, action: 'site.deleted', targetType: 'site', targetId: id, detail: { name: site.name } })
  return { id, deletedAt }
})
