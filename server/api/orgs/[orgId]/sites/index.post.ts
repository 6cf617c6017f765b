import { createSite, siteDto } from '~~/server/domain/sites'
import { OrgParamsSchema } from '#shared/schemas/common'
import { SiteInputSchema } from '#shared/schemas/site'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins add a site to their organisation; answers 201 with the stored site.
export default defineEventHandler(async (event) => {
  const { orgId } = await getValidatedRouterParams(event, validator(OrgParamsSchema, 'params'))
  const { user } = await requireRole(event, orgId, EDITOR_ROLES)
  const input = await readValidatedJson(event, SiteInputSchema, BODY_LIMITS.form)
  const site = await createSite(useDb(), { orgId, userId: user.id, input })
  await audit({ orgId, userId: user.id, action: 'site.created', targetType: 'site', targetId: site.id, detail: { name: site.name, riverName: site.river_name } })
  setResponseStatus(event, 201)
  return siteDto(useDb(), site)
})
