// Typed wrappers over the site routes (server/api/orgs/[orgId]/sites, server/api/sites/[id]).
// Shapes come from shared/schemas/site.ts, written once.
import type { SiteDto, SiteInput, SitePatch } from '#shared/schemas/site'
import type { SiteMapPoint } from '#shared/schemas/siteList'

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
