// Typed wrappers over the site routes (server/api/orgs/[orgId]/sites, server/api/sites/[id],
// server/api/attachments). Shapes come from shared/schemas/site.ts, written once.
import type { AttachmentDto, SiteDto, SiteInput, SiteListDto, SiteMapPoint, SitePatch, SiteSort } from '~~/shared/schemas/site'

/** Paging, sorting and filtering of the portfolio table. */
export interface SiteListParams {
  page: number
  pageSize: number
  sort: SiteSort
  dir: 'asc' | 'desc'
  q: string
}

/** One page of an organisation's sites, refetched when the organisation or the parameters change. */
export function useSiteList(orgId: Ref<number | null | undefined>, params: Ref<SiteListParams>) {
  return useFetch<SiteListDto>(() => `/api/orgs/${orgId.value}/sites`, {
    key: computed(() => `sites-${orgId.value}-${JSON.stringify(params.value)}`),
    query: computed(() => ({ ...params.value, q: params.value.q.trim() || undefined })),
    immediate: !!orgId.value,
    watch: [orgId],
  })
}

/** Every live site of the organisation as a map point (no paging). */
export function useSiteMapPoints(orgId: Ref<number | null | undefined>) {
  return useFetch<{ sites: SiteMapPoint[] }>(() => `/api/orgs/${orgId.value}/sites/map`, {
    key: computed(() => `site-map-${orgId.value}`),
    immediate: !!orgId.value,
    watch: [orgId],
  })
}

/** One site. */
export function useSite(id: Ref<number>) {
  return useFetch<SiteDto>(() => `/api/sites/${id.value}`, { key: computed(() => `site-${id.value}`) })
}

/** Creates a site in the organisation; answers the stored site. */
export function createSite(orgId: number, input: SiteInput): Promise<SiteDto> {
  return $fetch<SiteDto>(`/api/orgs/${orgId}/sites`, { method: 'POST', body: input })
}

/** Changes the fields given; `version` must be the one last read (a stale one answers 409). */
export function patchSite(id: number, patch: SitePatch): Promise<SiteDto> {
  return $fetch<SiteDto>(`/api/sites/${id}`, { method: 'PATCH', body: patch })
}

/** Soft-deletes the site (an administrator can restore it). */
export function deleteSite(id: number): Promise<{ id: number; deletedAt: string }> {
  return $fetch<{ id: number; deletedAt: string }>(`/api/sites/${id}`, { method: 'DELETE' })
}

/** Restores a soft-deleted site (administrators). */
export function restoreSite(id: number): Promise<SiteDto> {
  return $fetch<SiteDto>(`/api/sites/${id}/restore`, { method: 'POST' })
}

/** HTTP status of a failed $fetch or upload, or 0. */
export function statusOf(error: unknown): number {
  const e = error as { statusCode?: unknown; status?: unknown; response?: { status?: unknown } } | null
  const code = e?.statusCode ?? e?.status ?? e?.response?.status
  return typeof code === 'number' ? code : 0
}

/** True when the server refused a save because someone else changed the site first. */
export function isConflict(error: unknown): boolean {
  return statusOf(error) === 409
}

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
