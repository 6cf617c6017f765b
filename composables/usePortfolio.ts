// Typed wrappers over GET /api/orgs/[orgId]/portfolio (server/api/orgs/[orgId]/portfolio.get.ts):
// the paged table, every site for the map (`format=map`) and the CSV link. The map's colouring is in
// utils/portfolioMap.ts. Shapes come from shared/schemas/option.ts.
import type { PortfolioDto, PortfolioSort } from '#shared/schemas/portfolio'
import type { ReviewState } from '#shared/schemas/review'

/** Paging, sorting and filtering of the portfolio table. */
export interface PortfolioParams {
  page: number
  pageSize: number
  sort: PortfolioSort
  dir: 'asc' | 'desc'
  /** Text to find in the site or river name; '' for none. */
  q: string
  /** Only sites in this review state; '' for any. */
  reviewState: ReviewState | ''
}

/** The filters and sort of `params` as query parameters (empty ones left out). */
function filtersOf(params: PortfolioParams) {
  return { sort: params.sort, dir: params.dir, q: params.q.trim() || undefined, reviewState: params.reviewState || undefined }
}

/** One page of the portfolio, refetched when the organisation or the parameters change. */
export function usePortfolio(orgId: Ref<number | null | undefined>, params: Ref<PortfolioParams>) {
  return useFetch<PortfolioDto>(() => `/api/orgs/${orgId.value}/portfolio`, {
    key: computed(() => `portfolio-${orgId.value}-${JSON.stringify(params.value)}`),
    query: computed(() => ({ ...filtersOf(params.value), page: params.value.page, pageSize: params.value.pageSize })),
    immediate: !!orgId.value,
    watch: [orgId],
  })
}

/** Every live site of the organisation with its headline figures, for the map (one bounded query). */
export function usePortfolioMap(orgId: Ref<number | null | undefined>) {
  return useFetch<PortfolioDto>(() => `/api/orgs/${orgId.value}/portfolio`, {
    key: computed(() => `portfolio-map-${orgId.value}`),
    query: { format: 'map' },
    immediate: !!orgId.value,
    watch: [orgId],
  })
}

/** The CSV download of every row matching the table's filters, in its sort order. */
export function portfolioCsvUrl(orgId: number, params: PortfolioParams): string {
  const query = new URLSearchParams({ format: 'csv' })
  for (const [k, v] of Object.entries(filtersOf(params))) if (v !== undefined) query.set(k, String(v))
  return `/api/orgs/${orgId}/portfolio?${query.toString()}`
}
