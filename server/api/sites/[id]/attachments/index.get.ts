import { attachmentDto } from '../../../../domain/sites'
import { SiteParamsSchema } from '../../../../../shared/schemas/site'
import type { AttachmentDto } from '../../../../../shared/schemas/attachment'
import { READER_ROLES } from '../../../../../shared/utils/roles'

// The site's attachments, newest first, for every role of its organisation.
export default defineEventHandler(async (event): Promise<{ attachments: AttachmentDto[] }> => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  await requireSite(event, id, READER_ROLES)
  const rows = await useDb()
    .selectFrom('attachments')
    .leftJoin('users', 'users.id', 'attachments.uploaded_by')
    .selectAll('attachments')
    .select('users.name as uploader_name')
    .where('attachments.site_id', '=', id)
    .where('attachments.deleted_at', 'is', null)
    .orderBy('attachments.id', 'desc')
    .execute()
  return { attachments: rows.map((r) => attachmentDto(r, r.uploader_name)) }
})
