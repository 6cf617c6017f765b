// A site's attachments (server/api/sites/[id]/attachments, server/api/attachments).
import type { AttachmentDto } from '#shared/schemas/attachment'

/** The site's attachments, newest first as the server orders them. */
export function useAttachments(siteId: Ref<number>) {
  return useFetch<{ attachments: AttachmentDto[] }>(() => `/api/sites/${siteId.value}/attachments`, {
    key: computed(() => `attachments-${siteId.value}`),
  })
}

/** Removes one attachment. */
export function deleteAttachment(id: number): Promise<{ id: number; deleted: boolean }> {
  return $fetch<{ id: number; deleted: boolean }>(`/api/attachments/${id}`, { method: 'DELETE' })
}
