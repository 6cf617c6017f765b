import { restoreSite, siteDto } from '~~/server/domain/sites'
import { SiteParamsSchema } from '#shared/schemas/site'

// Admins bring back a soft-deleted site (409 when it is not deleted).
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, ['admin'], { deleted: 'only' })
  const restored = await restoreSite(useDb(), id, nowIso())
  await audit({ orgId: site.org_id, userId: user.id, action: 'site.restored', targetType: 'site', targetId: id, detail: { name: site.name } })
  return siteDto(useDb(), restored)
})
