// Summary links and the landowner summary: typed fetch wrappers over server/api/sites/[id]/summary-links*,
// server/api/summary-links/**, server/api/orgs/[orgId]/summary-links and server/api/public/summary/[token],
// (the summary in plain words is in utils/summary.ts).
import type { PublicSummaryDto, SummaryLinkCreatedDto, SummaryLinkDto, SummaryLinkInput, SummaryLinkListDto, SummaryLinkState } from '#shared/schemas/summaryLink'

/** The summary links of one site, newest first (engineers and admins). */
export function useSiteSummaryLinks(siteId: Ref<number>, enabled: boolean) {
  return useFetch<SummaryLinkListDto>(() => `/api/sites/${siteId.value}/summary-links`, {
    key: computed(() => `summary-links-${siteId.value}`),
    query: { pageSize: 100 },
    immediate: enabled,
  })
}

/** Every summary link of the organisation, optionally of one state (admins). */
export function useOrgSummaryLinks(orgId: Ref<number>, state: Ref<SummaryLinkState | ''>, page: Ref<number>) {
  return useFetch<SummaryLinkListDto>(() => `/api/orgs/${orgId.value}/summary-links`, {
    key: computed(() => `org-summary-links-${orgId.value}-${state.value}-${page.value}`),
    query: computed(() => ({ state: state.value || undefined, page: page.value, pageSize: 25 })),
  })
}

/** Creates a link; the answer holds the token and URL, shown this once only. */
export function createSummaryLink(siteId: number, body: SummaryLinkInput): Promise<SummaryLinkCreatedDto> {
  return $fetch<SummaryLinkCreatedDto>(`/api/sites/${siteId}/summary-links`, { method: 'POST', body })
}

/** Revokes a link at once; anyone opening it afterwards sees only that it is no longer available. */
export function revokeSummaryLink(id: number): Promise<SummaryLinkDto> {
  return $fetch<SummaryLinkDto>(`/api/summary-links/${id}`, { method: 'DELETE' })
}

/** The landowner summary behind a token; any refusal is answered the same way by the page. */
export function usePublicSummary(token: Ref<string>) {
  return useFetch<PublicSummaryDto>(() => `/api/public/summary/${encodeURIComponent(token.value)}`, {
    key: computed(() => `public-summary-${token.value}`),
  })
}
