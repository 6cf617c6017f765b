// Site attachments: photos, drawings and PDFs, their limits and how the routes show them.

/** Largest attachment accepted, bytes (20 MB). */
export const MAX_ATTACHMENT_BYTES = 20 * 1024 * 1024
/** Attachment types accepted, recognised by their first bytes, not by the name or the declared type. */
export const ATTACHMENT_TYPES = ['image/jpeg', 'image/png', 'image/webp', 'application/pdf'] as const
export type AttachmentType = (typeof ATTACHMENT_TYPES)[number]

/** One attachment of a site. Download from `/api/attachments/[id]`. */
export interface AttachmentDto {
  id: number
  siteId: number
  originalName: string
  contentType: AttachmentType
  sizeBytes: number
  uploadedBy: { id: number; name: string } | null
  createdAt: string
}
