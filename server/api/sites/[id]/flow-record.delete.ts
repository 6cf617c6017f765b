import { SiteParamsSchema } from '../../../../shared/schemas/site'
import { EDITOR_ROLES } from '../../../../shared/utils/roles'

// Engineers and admins remove a site's flow record (all its days) in one transaction; 404 when there is none.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  const removed = await useDb().transaction().execute(async (trx) => {
    const rec = await trx.deleteFrom('flow_records').where('site_id', '=', id).returning(['file_name', 'day_count']).executeTakeFirst()
    if (rec) await trx.deleteFrom('flow_days').where('site_id', '=', id).execute()
    return rec
  })
  if (!removed) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This site has no flow record' })
  await audit({ orgId: site.org_id, userId: user.id, action: 'flow-record.deleted', targetType: 'site', targetId: id, detail: { fileName: removed.file_name, days: removed.day_count } })
  return { id, deleted: true }
})
