import { siteDto, updateSite } from '~~/server/domain/sites'
import { SiteParamsSchema, SitePatchSchema } from '#shared/schemas/site'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins change a site. The body carries the version they last read: when someone else
// has saved since, 409 with the current version and nothing is changed. Each field given replaces the stored one.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  const patch = await readValidatedJson(event, SitePatchSchema, BODY_LIMITS.form)
  const { site: updated, changed } = await updateSite(useDb(), id, patch, nowIso())
  await audit({ orgId: site.org_id, userId: user.id, action: 'site.updated', targetType: 'site', targetId: id, detail: { fields: changed, version: updated.version } })
  return siteDto(useDb(), updated)
})
