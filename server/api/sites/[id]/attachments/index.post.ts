import { randomBytes } from 'node:crypto'
import { ATTACHMENT_TYPES, MAX_ATTACHMENT_BYTES, SiteParamsSchema, type AttachmentDto } from '../../../../../shared/schemas/site'
import { EDITOR_ROLES } from '../../../../../shared/utils/roles'

// Engineers and admins attach a photo or drawing (JPEG, PNG, WebP or PDF, told by its first bytes;
// 20 MB at most). It is kept under a random key; the client's name is only shown back.
export default defineEventHandler(async (event): Promise<AttachmentDto> => {
  const { id } = await getValidatedRouterParams(event, validator(SiteParamsSchema, 'params'))
  const { user, site } = await requireSite(event, id, EDITOR_ROLES)
  const { file, fileName } = await readUpload(event, MAX_ATTACHMENT_BYTES)
  const contentType = sniffAttachmentType(file.data)
  if (!contentType) {
    throw createError({
      statusCode: 415,
      statusMessage: 'Unsupported Media Type',
      message: `file: "${fileName}" is not a JPEG, PNG, WebP or PDF file (told by its content, not its name)`,
      data: { accepted: ATTACHMENT_TYPES },
    })
  }
  const storageKey = randomBytes(18).toString('base64url')
  const storage = await uploadsStorage()
  await storage.setItemRaw(storageKey, file.data)
  let row
  try {
    row = await useDb()
      .insertInto('attachments')
      .values({ site_id: id, storage_key: storageKey, original_name: fileName, content_type: contentType, size_bytes: file.data.length, uploaded_by: user.id })
      .returningAll()
      .executeTakeFirstOrThrow()
  } catch (error) {
    await storage.removeItem(storageKey)
    throw error
  }
  await audit({ orgId: site.org_id, userId: user.id, action: 'attachment.uploaded', targetType: 'attachment', targetId: row.id, detail: { siteId: id, name: fileName, contentType, sizeBytes: row.size_bytes } })
  setResponseStatus(event, 201)
  return attachmentDto(row, user.name)
})
