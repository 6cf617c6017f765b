import { sql } from 'kysely'
import { SiteParamsSchema, SitePatchSchema } from '../../../../shared/schemas/site'
import { EDITOR_ROLES } from '../../../../shared/utils/roles'

// Engineers and admins change a site. The body carries the version they last read: when someone else
// has saved since, 409 with the current version and nothing is changed. Each field given replaces the stored one.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  const { version, ...patch } = await readValidatedJson(event, SitePatchSchema, BODY_LIMITS.form)
  const changed = Object.keys(patch).filter((k) => patch[k as keyof typeof patch] !== undefined)
  const updated = await useDb()
    .updateTable('sites')
    .set({ ...siteColumns(patch), version: sql<number>`version + 1`, updated_at: nowIso() })
    .where('id', '=', id)
    .where('version', '=', version)
    .where('deleted_at', 'is', null)
    .returningAll()
    .executeTakeFirst()
  if (!updated) throw await staleVersionError('sites', id, version, 'site')
  await audit({ orgId: site.org_id, userId: user.id, action: 'site.updated', targetType: 'site', targetId: id, detail: { fields: changed, version: updated.version } })
  return siteDto(updated)
})
