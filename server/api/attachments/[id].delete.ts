import { SiteParamsSchema } from '../../../shared/schemas/site'
import { EDITOR_ROLES } from '../../../shared/utils/roles'

// Engineers and admins remove an attachment: it is marked deleted (404 from then on); its file stays in storage.
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { user, site, attachment } = await requireAttachment(event, id, EDITOR_ROLES)
  await useDb().updateTable('attachments').set({ deleted_at: nowIso() }).where('id', '=', id).execute()
  await audit({ orgId: site.org_id, userId: user.id, action: 'attachment.deleted', targetType: 'attachment', targetId: id, detail: { siteId: site.id, name: attachment.original_name } })
  return { id, deleted: true }
})
