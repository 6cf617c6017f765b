import { deleteAttachment } from '~~/server/domain/attachments'
import { SiteParamsSchema } from '#shared/schemas/site'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins remove an attachment. Nothing restores one, so its file is removed with it;
// the row stays, marked deleted (404 from then on), as the record of what was uploaded and by whom.
// A file the removal misses is swept when the server next starts. (A deleted site keeps its
// attachments and their files: an admin may restore the site.)
export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { user, site, attachment } = await requireAttachment(event, id, EDITOR_ROLES)
  await deleteAttachment(useDb(), id, nowIso())
  await removeUpload(attachment.storage_key).catch((error: unknown) => console.error(`[gillwatt] could not remove the file of attachment ${id}:`, error))
  await audit({ orgId: site.org_id, userId: user.id, action: 'attachment.deleted', targetType: 'attachment', targetId: id, detail: { siteId: site.id, name: attachment.original_name } })
  return { id, deleted: true }
})
