import { listAttachments } from '~~/server/domain/attachments'
import { SiteParamsSchema } from '#shared/schemas/site'
import type { AttachmentDto } from '#shared/schemas/attachment'
import { READER_ROLES } from '#shared/utils/roles'

// The site's attachments, newest first, for every role of its organisation.
export default defineEventHandler(async (event): Promise<{ attachments: AttachmentDto[] }> => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  await requireSite(event, id, READER_ROLES)
  return { attachments: await listAttachments(useDb(), id) }
})
