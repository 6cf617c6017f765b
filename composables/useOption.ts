// Design options: typed fetch wrappers over the option routes (server/api/options,
// server/api/sites/[id]/options, server/api/orgs/[orgId]/options). Shapes come from
// shared/schemas/option.ts, written once.
import { computed, type Ref } from 'vue'
import type { OptionDto, OptionInput, OptionListDto, OptionPatch, SweepSave } from '#shared/schemas/option'
import type { OrgOptionsDto, SiteOptions } from '#shared/schemas/compare'

/** A site's live options, each with its newest assessment. */
export function useSiteOptions(siteId: Ref<number>) {
  return useFetch<OptionListDto>(() => `/api/sites/${siteId.value}/options`, { key: computed(() => `options-${siteId.value}`) })
}

/** One option. */
export function useOption(id: Ref<number>) {
  return useFetch<OptionDto>(() => `/api/options/${id.value}`, { key: computed(() => `option-${id.value}`) })
}

/** Creates an option at a site; answers the stored option. */
export function createOption(siteId: number, input: OptionInput): Promise<OptionDto> {
  return $fetch<OptionDto>(`/api/sites/${siteId}/options`, { method: 'POST', body: input })
}

/** Changes the fields given; `version` must be the one last read (a stale one answers 409). */
export function patchOption(id: number, patch: OptionPatch): Promise<OptionDto> {
  return $fetch<OptionDto>(`/api/options/${id}`, { method: 'PATCH', body: patch })
}

/** Deletes the option. */
export function deleteOption(id: number): Promise<{ id: number; deletedAt: string }> {
  return $fetch<{ id: number; deletedAt: string }>(`/api/options/${id}`, { method: 'DELETE' })
}

/** Saves one sweep point as a new option at the same site. */
export function saveSweepPoint(optionId: number, body: SweepSave): Promise<OptionDto> {
  return $fetch<OptionDto>(`/api/options/${optionId}/sweep/save`, { method: 'POST', body })
}

/** Every live site of the organisation (up to 200, by name) with its live options, in one request. */
export function useOrgOptions(orgId: Ref<number | null | undefined>) {
  const fetcher = useRequestFetch()
  return useAsyncData(
    () => `org-options-${orgId.value}`,
    async (): Promise<SiteOptions[]> =>
      orgId.value ? (await fetcher<OrgOptionsDto>(`/api/orgs/${orgId.value}/options`)).sites : [],
    { watch: [orgId] },
  )
}
