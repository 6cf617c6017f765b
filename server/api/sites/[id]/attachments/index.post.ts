import { randomBytes } from 'node:crypto'
import { attachmentDto, forgetAttachment, storeAttachment } from '~~/server/domain/attachments'
import { SiteParamsSchema } from '#shared/schemas/site'
import { ATTACHMENT_TYPES, MAX_ATTACHMENT_BYTES, type AttachmentDto } from '#shared/schemas/attachment'
import { EDITOR_ROLES } from '#shared/utils/roles'

// Engineers and admins attach a photo or drawing (JPEG, PNG, WebP or PDF, told by its first bytes;
// 20 MB at most). It is kept under a random key; the client's name is only shown back. The file is
// streamed to a pending name, and takes its final name only once its row is stored (see storage.ts),
// so a refused or failed upload leaves no file behind.
export default defineEventHandler(async (event): Promise<AttachmentDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  rateLimit(event, 'uploads', user.id)
  const storageKey = randomBytes(18).toString('base64url')
  const { file } = await readUploadToFile(event, MAX_ATTACHMENT_BYTES, await pendingUploadPath(storageKey))
  const { fileName } = file
  let row
  try {
    const contentType = sniffAttachmentType(file.head)
    if (!contentType) {
      throw createError({
        statusCode: 415,
        statusMessage: 'Unsupported Media Type',
        message: `file: "${fileName}" is not a JPEG, PNG, WebP or PDF file (told by its content, not its name)`,
        data: { accepted: ATTACHMENT_TYPES },
      })
    }
    row = await storeAttachment(useDb(), { siteId: id, storageKey, fileName, contentType, sizeBytes: file.size, uploadedBy: user.id })
  } catch (error) {
    await discardPendingUpload(storageKey)
    throw error
  }
  try {
    await commitUpload(storageKey)
  } catch (error) {
    // The row must not outlive a file that never took its name.
    await forgetAttachment(useDb(), row.id)
    await discardPendingUpload(storageKey)
    throw error
  }
  await audit({ orgId: site.org_id, userId: user.id, action: 'attachment.uploaded', targetType: 'attachment', targetId: row.id, detail: { siteId: id, name: fileName, contentType: row.content_type, sizeBytes: row.size_bytes } })
  setResponseStatus(event, 201)
  return attachmentDto(row, user.name)
})
